// PATCH /api/me/preferences: what it takes, what it refuses, and that a
// refusal keeps what was saved. A member of its own, so no other test sees
// these changes. The bounds are our own (shared/utils/preferences.ts); paper
// names are the sizes of REFERENCES.md (ASME Y14.1, ISO 216).
import { beforeAll, describe, expect, it, inject } from 'vitest'
import { hasher } from '../../scripts/seed'
import { api, signIn } from './support/api'
import { createOwnMember } from './support/fixtures'

let cookie = ''

beforeAll(async () => {
  const own = await createOwnMember(inject('databaseUrl'), p => hasher.make(p), 'Harbour Lane Youth Theatre', 'viewer')
  cookie = await signIn(own.email, own.password)
})

async function stored() {
  const me = await api('/api/me', { cookie })
  expect(me.status).toBe(200)
  return me.body.preferences
}

describe('PATCH /api/me/preferences', () => {
  it('answers 401 without a session', async () => {
    const res = await api('/api/me/preferences', { method: 'PATCH', body: { units: 'mm' } })
    expect(res.status).toBe(401)
  })

  it('merges what is sent into what was saved and answers the whole', async () => {
    const first = await api('/api/me/preferences', { method: 'PATCH', cookie, body: { units: 'mm', export: { paper: 'a3' } } })
    expect(first.status).toBe(200)
    const second = await api('/api/me/preferences', { method: 'PATCH', cookie, body: { fraction: 32, export: { overlap: 20 } } })
    expect(second.status).toBe(200)
    expect(second.body).toMatchObject({ units: 'mm', fraction: 32, export: { paper: 'a3', overlap: 20 } })
    expect(await stored()).toEqual(second.body)
  })

  it.each([
    ['an unknown key', { colour: 'green' }, null],
    ['units other than in or mm', { units: 'cm' }, 'units'],
    ['a fraction other than 16 or 32', { fraction: 8 }, 'fraction'],
    ['a paper that is not offered', { export: { paper: 'b5' } }, 'export.paper'],
    ['an overlap over 50 mm', { export: { overlap: 51 } }, 'export.overlap'],
    ['a negative margin', { export: { margin: -1 } }, 'export.margin'],
    ['a margin that is not a number', { export: { margin: '1/4' } }, 'export.margin'],
    ['a bit wider than 50 mm', { export: { bushing: { bushingDiameter: 55, bitDiameter: 51 } } }, 'export.bushing.bitDiameter'],
    ['a bushing of no size', { export: { bushing: { bushingDiameter: 0, bitDiameter: 6.35 } } }, 'export.bushing.bushingDiameter'],
    ['mirror that is not true or false', { export: { mirror: 'yes' } }, 'export.mirror'],
    ['export that is not an object', { export: 'a4' }, 'export'],
  ])('refuses %s with 422 and a field message, and keeps what was saved', async (_what, body, field) => {
    const before = await stored()
    const res = await api('/api/me/preferences', { method: 'PATCH', cookie, body })
    expect(res.status, JSON.stringify(res.body)).toBe(422)
    const fields = res.body.data.fields as Record<string, string>
    expect(Object.keys(fields).length).toBeGreaterThan(0)
    if (field) expect(fields[field], JSON.stringify(fields)).toBeTruthy()
    expect(await stored()).toEqual(before)
  })

  it('answers 400 for a body that is not JSON, and keeps what was saved', async () => {
    const before = await stored()
    const res = await api('/api/me/preferences', { method: 'PATCH', cookie, rawBody: '{"units":' })
    expect(res.status).toBe(400)
    expect(await stored()).toEqual(before)
  })
})
