export interface MemberRow { id: string; name: string; email: string; role: ShopRole; since: string }
export interface InvitationRow { id: string; email: string; role: ShopRole; createdAt: string; updatedAt: string; expiresAt: string; invitedBy: string | null; expired: boolean }
export interface ActivityRow { id: string; action: string; detail: Record<string, unknown>; createdAt: string; user: { id: string | null; name: string | null }; design: { id: string | null; name: string | null } }
export interface ShareRow { id: string; note: string; createdAt: string; expiresAt: string; withdrawnAt: string | null; createdBy: string | null; downloads: number; state: 'open' | 'expired' | 'withdrawn' }

export function useMembers() {
  return useFetch<MemberRow[]>('/api/shop/members', { key: 'members', default: () => [] })
}

export function useInvitations() {
  return useFetch<InvitationRow[]>('/api/shop/invitations', { key: 'invitations', default: () => [] })
}

export function useShares(revisionId: MaybeRefOrGetter<string>) {
  return useFetch<ShareRow[]>(() => `/api/revisions/${toValue(revisionId)}/shares`, { key: `shares:${toValue(revisionId)}`, default: () => [] })
}
