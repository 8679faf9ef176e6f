import { problemCounts, problemRows, type MessageUnits, type Plate, type ProblemRow } from '~~/geometry/core'

/** How long the plate must stay still before each row's suggested value is worked out and tried (one rebuild per row). */
const SUGGEST_AFTER_MS = 250

/**
 * The plate's problems as the reader sees them: one row per kind of problem,
 * in their units. Rows follow every change at once; the value each row
 * suggests is worked out once the plate stops changing, so a drag stays smooth.
 */
export function useProblems(plate: MaybeRefOrGetter<Plate>, units: MaybeRefOrGetter<MessageUnits>) {
  const quick = computed(() => problemRows(toValue(plate), { ...toValue(units), suggest: false }))
  const checked = shallowRef<{ plate: Plate; units: MessageUnits; rows: ProblemRow[] } | null>(null)
  let timer: ReturnType<typeof setTimeout> | null = null

  if (import.meta.client) {
    watch([() => toValue(plate), () => toValue(units)], ([p, u]) => {
      if (timer) clearTimeout(timer)
      timer = setTimeout(() => {
        timer = null
        checked.value = { plate: p, units: u, rows: problemRows(p, u) }
      }, SUGGEST_AFTER_MS)
    }, { immediate: true })
    onScopeDispose(() => { if (timer) clearTimeout(timer) })
  }

  const rows = computed<ProblemRow[]>(() => {
    const c = checked.value
    return c && c.plate === toValue(plate) && c.units === toValue(units) ? c.rows : quick.value
  })
  const counts = computed(() => problemCounts(rows.value))
  return { rows, counts }
}
