import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import { fieldMessages, parseOr422 } from '../../../server/utils/validation'

describe('request validation', () => {
  const schema = z.object({ name: z.string().min(1, 'Give it a name'), size: z.object({ mm: z.number().positive('Must be more than 0') }) })

  it('turns zod issues into one message per field path', () => {
    const r = schema.safeParse({ name: '', size: { mm: -1 } })
    expect(r.success).toBe(false)
    if (!r.success) expect(fieldMessages(r.error)).toEqual({ 'name': 'Give it a name', 'size.mm': 'Must be more than 0' })
  })

  it('throws a 422 carrying the field messages, and returns parsed data when valid', () => {
    expect(parseOr422(schema, { name: 'a', size: { mm: 3 } })).toEqual({ name: 'a', size: { mm: 3 } })
    try {
      parseOr422(schema, { name: 'a', size: { mm: 0 } })
      expect.unreachable()
    }
    catch (err: unknown) {
      const e = err as { statusCode: number; data: { fields: Record<string, string> } }
      expect(e.statusCode).toBe(422)
      expect(e.data.fields).toEqual({ 'size.mm': 'Must be more than 0' })
    }
  })
})
