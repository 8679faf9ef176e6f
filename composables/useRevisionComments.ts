import type { CommentRow } from '~~/server/services/revision-comments'

/** A comment as JSON brings it: the date as an ISO string. */
export type RevisionCommentRow = Omit<CommentRow, 'createdAt'> & { createdAt: string }

/** One revision's comments, oldest first. */
export function useRevisionComments(revisionId: MaybeRefOrGetter<string>) {
  return useFetch<RevisionCommentRow[]>(() => `/api/revisions/${toValue(revisionId)}/comments`, { key: `comments:${toValue(revisionId)}`, default: () => [] })
}
