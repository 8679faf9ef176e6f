import type { ShowDetail, ShowRow } from '~~/server/services/shows'
import type { Family } from '~~/server/services/families'

type Json<T> = T extends Date ? string : T extends (infer U)[] ? Json<U>[] : T extends object ? { [K in keyof T]: Json<T[K]> } : T

export type ShowListRow = Json<ShowRow>
export type ShowView = Json<ShowDetail>
export type FamilyView = Json<Family>

export function useShows(archived: MaybeRefOrGetter<'hide' | 'only' | 'all'> = 'hide') {
  return useFetch<ShowListRow[]>('/api/shows', { key: `shows:${toValue(archived)}`, query: computed(() => ({ archived: toValue(archived) })), default: () => [] })
}

export function useShow(id: MaybeRefOrGetter<string>) {
  return useFetch<ShowView>(() => `/api/shows/${toValue(id)}`, { key: `show:${toValue(id)}` })
}

export function useFamily(id: MaybeRefOrGetter<string>) {
  return useFetch<FamilyView>(() => `/api/designs/${toValue(id)}/family`, { key: `family:${toValue(id)}` })
}
