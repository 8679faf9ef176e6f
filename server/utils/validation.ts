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

/** The JSON body, validated. Malformed JSON is a 400 from h3 itself. */
export async function readBodyWith<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const body: unknown = await readBody(event).catch(() => {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The request body is not valid JSON' })
  })
  return parseOr422(schema, body ?? {})
}

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
