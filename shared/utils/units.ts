// The register's words, shared by the pages and the server.
export const unitKinds = ['plate', 'pattern'] as const
export type UnitKind = (typeof unitKinds)[number]

/** The shop stages a unit moves through, in order. */
export const unitStatuses = ['cut', 'laminated', 'hardware_fitted', 'finished', 'in_stock', 'on_loan', 'retired'] as const
export type UnitStatus = (typeof unitStatuses)[number]

export const unitStatusLabels: Record<UnitStatus, string> = {
  cut: 'Cut',
  laminated: 'Laminated',
  hardware_fitted: 'Hardware fitted',
  finished: 'Finished',
  in_stock: 'In stock',
  on_loan: 'On loan',
  retired: 'Retired',
}

export const unitKindLabels: Record<UnitKind, string> = {
  plate: 'Plate unit',
  pattern: 'Pattern',
}

/** Stages a person may set by hand; a loan is recorded with its borrower and dates instead. */
export const settableStatuses = unitStatuses.filter(s => s !== 'on_loan')
