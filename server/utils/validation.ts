import { createError, getQuery, getRouterParam, readBody, type H3Event } from 'h3'
import { z } from 'zod'

/** Field path -> first message, the shape every form reads from a 422. */
export type FieldMessages = Record<string, string>

export function fieldMessages(error: z.ZodError): FieldMessages {
  const out: FieldMessages = {}
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_'
    out[key] ??= issue.message
  }
  return out
}

export function invalid(fields: FieldMessages, message = 'Some fields need attention'): never {
  throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message, data: { fields } })
}

/** Parses with a zod schema; a failure is a 422 carrying field messages. */
export function parseOr422<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const result = schema.safeParse(input)
  if (!result.success) invalid(fieldMessages(result.error))
  return result.data
}

/** The JSON body, validated. Malformed JSON is a 400; text PostgreSQL cannot store is a 422. */
export async function readBodyWith<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const body: unknown = await readBody(event).catch(() => {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The request body is not valid JSON' })
  })
  const bad = unstorableText(body)
  if (bad) invalid({ [bad]: TEXT_MESSAGE })
  return parseOr422(schema, body ?? {})
}

/** Why a string cannot be kept: PostgreSQL text and jsonb refuse NUL, and a lone UTF-16 surrogate is not text at all. */
export const TEXT_MESSAGE = 'Remove the invisible control character or broken symbol from this text'

/** Whether PostgreSQL can store the string (no NUL, no lone surrogate). */
export function storableText(s: string): boolean {
  return !s.includes('\u0000') && !LONE_SURROGATE.test(s)
}

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/

/**
 * The path of the first string (value or key) anywhere in a parsed body that
 * PostgreSQL could not store, or null. Checked before any schema, so fields
 * passed through as JSON (params, details) are covered as well as names.
 * Walked with an explicit stack, each value visited once and its path only
 * built when something is found: linear in the body, whatever its depth (the
 * request guard refuses bodies nested deeper than MAX_JSON_DEPTH before this).
 */
export function unstorableText(value: unknown): string | null {
  interface Step { value: unknown; parent: Step | null; key: string }
  const pathOf = (step: Step | null, last?: string): string => {
    const keys: string[] = last === undefined ? [] : [last]
    for (let s = step; s && s.parent; s = s.parent) keys.push(s.key)
    return keys.reverse().join('.') || '_'
  }
  const stack: Step[] = [{ value, parent: null, key: '' }]
  while (stack.length) {
    const step = stack.pop()!
    const v = step.value
    if (typeof v === 'string') {
      if (!storableText(v)) return pathOf(step)
      continue
    }
    if (!v || typeof v !== 'object') continue
    // Pushed last to first, so the first bad string in document order is the one named.
    if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ value: v[i], parent: step, key: String(i) })
      continue
    }
    const entries = Object.entries(v)
    for (const [k] of entries) if (!storableText(k)) return pathOf(step, '(key)')
    for (let i = entries.length - 1; i >= 0; i--) stack.push({ value: entries[i]![1], parent: step, key: entries[i]![0] })
  }
  return null
}

/** The deepest nesting of arrays and objects a JSON body may have; no form of ours nests past a handful. */
export const MAX_JSON_DEPTH = 32

/**
 * How deeply the JSON text nests its arrays and objects, counted on the raw
 * bytes before any parsing (brackets inside strings do not count), stopping as
 * soon as `max` is passed: one pass, no recursion, no allocation.
 */
export function jsonDepthOver(body: Uint8Array, max = MAX_JSON_DEPTH): boolean {
  let depth = 0
  let inString = false
  for (let i = 0; i < body.length; i++) {
    const c = body[i]!
    if (inString) {
      if (c === 0x5C) i++ // a backslash: the next byte is escaped
      else if (c === 0x22) inString = false
      continue
    }
    if (c === 0x22) inString = true
    else if (c === 0x5B || c === 0x7B) {
      if (++depth > max) return true
    }
    else if (c === 0x5D || c === 0x7D) depth--
  }
  return false
}

/**
 * A trimmed text field with a length limit that PostgreSQL can store: the
 * shared rule for names, labels and notes.
 */
export function textField(max: number, tooLong: string) {
  return z.string().trim().max(max, tooLong).refine(storableText, TEXT_MESSAGE)
}

/** PostgreSQL's `integer` column range: anything beyond would fail in the database. */
export const PG_INT_MAX = 2_147_483_647

export function queryWith<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  return parseOr422(schema, getQuery(event))
}

const uuid = z.uuid()

/** A route id that is not a uuid names nothing: 404, like a missing row. */
export function routeId(event: H3Event, name = 'id'): string {
  const raw = getRouterParam(event, name)
  if (!uuid.safeParse(raw).success) throw notFound()
  return raw as string
}

export function notFound(what = 'That item'): Error {
  return createError({ statusCode: 404, statusMessage: 'Not Found', message: `${what} does not exist or is not in your shop` })
}
