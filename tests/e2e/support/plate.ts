import { normaliseParams } from '../../../server/utils/params'

/** The params the server stores for an empty input: every default filled. */
export function plateDefaults(): Record<string, unknown> {
  return normaliseParams({}) as Record<string, unknown>
}
