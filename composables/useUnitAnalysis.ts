import { analyseUnit, formatForce, formatMass, type Plate, type UnitAnalysis } from '~~/geometry/core'

/**
 * The shop math of the plate on screen, recomputed as it changes (it follows
 * a drag: unitStability takes well under a millisecond). Findings are
 * written in the user's units.
 */
export function useUnitAnalysis(plate: Ref<Plate>, units: Ref<'in' | 'mm'>, formatLength: (mm: number) => string) {
  let last: UnitAnalysis | null = null
  return computed<UnitAnalysis>(() => {
    const u = units.value
    try {
      last = analyseUnit(plate.value, undefined, { length: formatLength, mass: kg => formatMass(kg, u), force: n => formatForce(n, u) })
    }
    catch (err: unknown) {
      // A half-typed value must not blank the panel; the first failure has nothing to fall back on.
      if (!last) throw err
    }
    return last!
  })
}
