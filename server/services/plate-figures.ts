// The figures a show lists for each design: one plate rebuilt from a stored
// revision's params. Revisions never change, so shows.ts keeps these per
// revision and builds only the ones it has not seen, on an export worker.
// Nothing here may use Nitro's auto-imports or the database.
import { buildPlate, plateParamsSchema } from '../../geometry/core'

export interface PlateFigures {
  /** From the revision; null only for stored params the current schema no longer reads. */
  tubeDiameter: number | null
  /** One plate's estimated weight, kg (plywood only; see the metrics' density source). */
  weight: number | null
  width: number | null
  height: number | null
  errors: number
  warnings: number
}

export function plateFigures(params: unknown): PlateFigures {
  const parsed = plateParamsSchema.safeParse(params)
  if (!parsed.success) return { tubeDiameter: null, weight: null, width: null, height: null, errors: 1, warnings: 0 }
  const plate = buildPlate(parsed.data)
  return {
    tubeDiameter: plate.params.tubeDiameter,
    weight: plate.metrics.weight,
    width: plate.metrics.width,
    height: plate.metrics.height,
    errors: plate.findings.filter(f => f.severity === 'error').length,
    warnings: plate.findings.filter(f => f.severity === 'warning').length,
  }
}
