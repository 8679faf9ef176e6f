import { invalid, fieldMessages, type FieldMessages } from './validation'
import { z } from 'zod'

// Until the geometry library's schema is wired in, params are any JSON object.
const anyParams = z.record(z.string(), z.unknown())

/** Plate params from a request, validated; field paths are prefixed `params.`. */
export function parseParams(input: unknown) {
  const result = anyParams.safeParse(input)
  if (!result.success) {
    invalid(prefixed(fieldMessages(result.error)))
  }
  return result.data
}

function prefixed(fields: FieldMessages): FieldMessages {
  return Object.fromEntries(Object.entries(fields).map(([k, v]) => [k === '_' ? 'params' : `params.${k}`, v]))
}

/** What the server stores for params that passed validation. */
export function normaliseParams(input: Record<string, unknown>): unknown {
  return anyParams.parse(input)
}
