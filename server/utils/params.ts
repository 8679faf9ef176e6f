import { plateParamsSchema, type PlateParams } from '../../geometry'
import { invalid, fieldMessages, type FieldMessages } from './validation'

/**
 * Plate params from a request, validated with the same schema the editor
 * uses; what is stored is the parsed result (defaults filled, unknown keys
 * dropped). Field paths are prefixed `params.`.
 */
export function parseParams(input: unknown): PlateParams {
  const result = plateParamsSchema.safeParse(input)
  if (!result.success) {
    invalid(prefixed(fieldMessages(result.error)), 'The plate parameters need attention')
  }
  return result.data
}

function prefixed(fields: FieldMessages): FieldMessages {
  return Object.fromEntries(Object.entries(fields).map(([k, v]) => [k === '_' ? 'params' : `params.${k}`, v]))
}

/** What the server stores for params given in code (the demo seed, fixtures). Throws when invalid. */
export function normaliseParams(input: Record<string, unknown>): PlateParams {
  return plateParamsSchema.parse(input)
}
