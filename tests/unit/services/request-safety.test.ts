import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { storableText, unstorableText } from '../../../server/utils/validation'
import { databaseProblem } from '../../../server/utils/db'
import { bodyRule, BODY_LIMITS } from '../../../server/utils/request-limits'

describe('text PostgreSQL can store', () => {
  // PostgreSQL documentation 8.3: "the character with code zero (sometimes
  // called NUL) cannot be stored" in text; Unicode 15 ch. 3 (D91): a lone
  // surrogate code unit is ill-formed UTF-16, so it has no UTF-8 form at all.
  it('refuses NUL and lone surrogates, keeps well-formed text including surrogate pairs', () => {
    expect(storableText('Old king beech')).toBe(true)
    expect(storableText('Beech 🌳')).toBe(true) // U+1F333 is the pair D83C DF33
    expect(storableText('a\u0000b')).toBe(false)
    expect(storableText('\ud800')).toBe(false)
    expect(storableText('x\udc00')).toBe(false)
    expect(storableText('\udf33\ud83c')).toBe(false) // a pair in the wrong order is two lone halves
  })

  it('agrees with Node\'s own UTF-8 round trip for any string (independent check)', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary' }), (s) => {
      const roundTrips = Buffer.from(s, 'utf8').toString('utf8') === s
      expect(storableText(s)).toBe(roundTrips && !s.includes('\u0000'))
    }), { numRuns: 500 })
  })

  it('finds the first bad string anywhere in a body, keys included, with its path', () => {
    expect(unstorableText({ name: 'ok', params: { lobes: [{ label: 'x' }, { label: 'y\u0000' }] } })).toBe('params.lobes.1.label')
    expect(unstorableText({ ['bad\ud800']: 1 })).toBe('(key)')
    expect(unstorableText({ name: 'fine', n: 3, list: [1, null, true] })).toBeNull()
  })
})

describe('database errors that mean "away"', () => {
  it('recognises connection failures and shutdown codes, also wrapped as a cause', () => {
    // SQLSTATE 57P01 admin_shutdown, 08006 connection_failure (PostgreSQL docs, Appendix A).
    expect(databaseProblem(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:1'), { code: 'ECONNREFUSED' }))).toBe('unreachable')
    expect(databaseProblem(new Error('query failed', { cause: Object.assign(new Error('terminating'), { code: '57P01' }) }))).toBe('unreachable')
    expect(databaseProblem({ code: '08006' })).toBe('unreachable')
    expect(databaseProblem(new AggregateError([Object.assign(new Error('x'), { code: 'ECONNREFUSED' })]))).toBe('unreachable')
    // 42P01 undefined_table: reachable, but not a Rootplate database.
    expect(databaseProblem({ code: '42P01' })).toBe('unmigrated')
    // 23505 unique_violation is the application's business, not an outage.
    expect(databaseProblem({ code: '23505' })).toBeNull()
    expect(databaseProblem(new Error('plain'))).toBeNull()
  })
})

describe('body limits by route', () => {
  it('gives sign-in and preferences small limits, designs larger, attachments their own with multipart', () => {
    expect(bodyRule('/api/auth/login')).toEqual({ limit: BODY_LIMITS.auth, multipart: false })
    expect(bodyRule('/api/me/preferences').limit).toBeLessThanOrEqual(16 * 1024)
    expect(bodyRule('/api/designs/abc/revisions').limit).toBeGreaterThan(bodyRule('/api/auth/login').limit)
    expect(bodyRule('/api/designs/abc/attachments')).toEqual({ limit: BODY_LIMITS.attachment, multipart: true })
    expect(bodyRule('/api/units/abc/photos')).toEqual({ limit: BODY_LIMITS.attachment, multipart: true })
    // The uploads limit is 15 MB; the framing of a multipart body needs a little more.
    expect(BODY_LIMITS.attachment).toBeGreaterThan(15 * 1024 * 1024)
    expect(bodyRule('/api/designs').multipart).toBe(false)
  })
})
