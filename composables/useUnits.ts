import type { UnitKind, UnitStatus } from '~~/shared/utils/units'

export interface UnitRow {
  id: string
  kind: UnitKind
  label: string
  status: UnitStatus
  sizeLabel: string | null
  location: string
  notes: string
  designId: string | null
  designName: string | null
  revisionId: string | null
  revisionNumber: number | null
  updatedAt: string
  createdAt: string
  loan: { id: string; borrower: string; outOn: string; dueOn: string; overdue: boolean } | null
}
export interface UnitDetail extends UnitRow {
  history: { id: string; action: string; changes: Record<string, unknown>; createdAt: string; userName: string | null }[]
  loans: { id: string; borrower: string; outOn: string; dueOn: string; returnedOn: string | null }[]
  photos: { id: string; kind: 'image' | 'pdf'; name: string; size: number; createdAt: string; url: string }[]
}
export interface UnitFilterInput { status?: UnitStatus | ''; kind?: UnitKind | ''; q?: string; designId?: string }

function clean(filter: UnitFilterInput) {
  return Object.fromEntries(Object.entries(filter).filter(([, v]) => v !== '' && v !== undefined))
}

export function useUnits(filter: MaybeRefOrGetter<UnitFilterInput>) {
  return useFetch<UnitRow[]>('/api/units', { key: 'units', query: computed(() => clean(toValue(filter))), default: () => [] })
}

export function useUnit(id: MaybeRefOrGetter<string>) {
  return useFetch<UnitDetail>(() => `/api/units/${toValue(id)}`, { key: `unit:${toValue(id)}` })
}

export function useOverdueLoans() {
  return useFetch<UnitRow[]>('/api/units/overdue', { key: 'overdue-loans', default: () => [] })
}

export function useUnitCounts(designId: MaybeRefOrGetter<string>) {
  return useFetch<{ revisionId: string | null; number: number | null; built: number; active: number; onLoan: number }[]>(
    () => `/api/designs/${toValue(designId)}/unit-counts`, { key: `unit-counts:${toValue(designId)}`, default: () => [] })
}

/** Today as YYYY-MM-DD in the reader's own time zone (loans are kept by calendar day). */
export function localToday(): string {
  const now = new Date()
  return new Date(now.getTime() - now.getTimezoneOffset() * 60_000).toISOString().slice(0, 10)
}
