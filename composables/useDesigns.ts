import type { DesignListItem, DesignDetail, RevisionSummary } from '~~/server/services/designs'

type Json<T> = { [K in keyof T]: T[K] extends Date ? string : T[K] extends Date | null ? string | null : T[K] extends object | null ? Json<T[K]> : T[K] }

export type DesignRow = Json<DesignListItem>
export type DesignView = Omit<Json<DesignDetail>, 'latest'> & { latest: Json<DesignDetail['latest']> & { params: Record<string, unknown> } }
export type RevisionRow = Json<RevisionSummary>

export function useDesigns() {
  return useFetch<DesignRow[]>('/api/designs', { key: 'designs', default: () => [] })
}

/** The design list as searched and filtered on the home page. */
export function useDesignSearch(filter: MaybeRefOrGetter<{ q: string; show: string; archived: 'hide' | 'only' }>) {
  const query = computed(() => {
    const f = toValue(filter)
    return { ...(f.q.trim() ? { q: f.q.trim() } : {}), ...(f.show ? { show: f.show } : {}), archived: f.archived }
  })
  return useFetch<DesignRow[]>('/api/designs', { key: 'designs', query, default: () => [] })
}

export function useDesign(id: MaybeRefOrGetter<string>) {
  return useFetch<DesignView>(() => `/api/designs/${toValue(id)}`, { key: `design:${toValue(id)}` })
}

export function useRevisions(id: MaybeRefOrGetter<string>) {
  return useFetch<RevisionRow[]>(() => `/api/designs/${toValue(id)}/revisions`, { key: `revisions:${toValue(id)}`, default: () => [] })
}
