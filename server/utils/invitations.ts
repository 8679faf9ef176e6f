import type { H3Event } from 'h3'
import type { InvitationState } from '../services/invitations'

/** The invitation token of the route; a malformed one names nothing (404). */
export function invitationToken(event: H3Event): string {
  const raw = getRouterParam(event, 'token')
  if (!linkToken.safeParse(raw).success) throw invitationGone('missing')
  return raw as string
}

export function invitationGone(state: InvitationState): Error {
  if (state === 'used') return createError({ statusCode: 410, statusMessage: 'Gone', message: 'This invitation has already been used. Sign in instead, or ask the shop lead for a new one.' })
  if (state === 'expired') return createError({ statusCode: 410, statusMessage: 'Gone', message: 'This invitation has expired (they last seven days). Ask the shop lead to send it again.' })
  return createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This invitation is not known or was withdrawn. Ask the shop lead for a new one.' })
}
