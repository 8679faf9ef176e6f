// How long links and sessions live, against the figures the README gives
// (issue 27): an invitation link seven days ("A short tour", shop set-up 7),
// a password-reset link an hour (tour 9), a session 720 minutes without use
// and 30 days after sign-in at most ("Sessions live in PostgreSQL ..."). The
// figures are read from README.md here, not from the server's constants.
// Time is moved by shifting the test's own rows back (made and end times
// together, as if made earlier): one minute inside the README's life the link
// or session still works, one minute past it, it no longer does.
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { api, freshAddress } from './support/api'
import { makeShop, sessionRowId, signInAs, tokenOf, uniqueEmail } from './support/crew'
import { testSql } from './support/db'
import { mailFilesTo, waitForMail } from './support/mail'

const readme = readFileSync(fileURLToPath(new URL('../../README.md', import.meta.url)), 'utf8')
const words: Record<string, number> = { a: 1, an: 1, one: 1, two: 2, three: 3, seven: 7, fourteen: 14, thirty: 30 }
const amount = (s: string) => words[s.toLowerCase()] ?? Number(s)
const MINUTE = 60

/** The README's figures, in seconds. */
const life = {
  invitation: (() => {
    const m = /invite an address[^\n]*?works for (\w+) days/.exec(readme)
    if (!m) throw new Error('README: no invitation life ("works for N days") in the shop set-up tour')
    return amount(m[1]!) * 86_400
  })(),
  reset: (() => {
    const m = /Forgotten password[^\n]*?works once, for (\w+) hours?/.exec(readme)
    if (!m) throw new Error('README: no reset-link life ("works once, for an hour")')
    return amount(m[1]!) * 3_600
  })(),
  idle: (() => {
    const m = /`SESSION_IDLE_MINUTES` without use \(default (\d+)\)/.exec(readme)
    if (!m) throw new Error('README: no session idle default')
    return Number(m[1]) * MINUTE
  })(),
  max: (() => {
    const m = /`SESSION_MAX_DAYS` after sign-in \(default (\d+)\)/.exec(readme)
    if (!m) throw new Error('README: no session maximum default')
    return Number(m[1]) * 86_400
  })(),
}

/** Moves a row back in time by `seconds`: every listed timestamp column at once. */
async function shift(table: string, columns: string[], where: string, param: string, seconds: number): Promise<void> {
  const set = columns.map(c => `${c} = ${c} - make_interval(secs => $2)`).join(', ')
  const rows = await testSql(`update ${table} set ${set} where ${where} = $1 returning 1`, [param, seconds])
  expect(rows, `${table} row to move`).toHaveLength(1)
}

describe('the README\'s figures', () => {
  it('are the ones this file tests (7 days, 1 hour, 720 minutes, 30 days)', () => {
    // A guard on the parsing above: the README's words as written today.
    expect(life).toEqual({ invitation: 7 * 86_400, reset: 3_600, idle: 720 * MINUTE, max: 30 * 86_400 })
  })
})

describe('an invitation link', () => {
  it('is stored with the README\'s life, works a minute before its end and answers 410 a minute after', async () => {
    const { people: [lead] } = await makeShop('Lifetime Invitations', [{ role: 'lead', name: 'Lia Life' }])
    const cookie = await signInAs(lead!.email, lead!.password)
    const email = uniqueEmail('life-invite')
    const made = await api('/api/shop/invitations', { method: 'POST', cookie, body: { email, role: 'viewer' } })
    expect(made.status).toBe(201)
    const token = tokenOf((await waitForMail(email, /./)).link)
    const [row] = await testSql<{ seconds: number }[]>('select extract(epoch from (expires_at - created_at))::float8 as seconds from invitations where id = $1', [made.body.id])
    expect(Math.abs(row!.seconds - life.invitation)).toBeLessThan(MINUTE)

    await shift('invitations', ['created_at', 'expires_at'], 'id', made.body.id, life.invitation - MINUTE)
    expect((await api(`/api/invitations/${token}`)).status).toBe(200)
    await shift('invitations', ['created_at', 'expires_at'], 'id', made.body.id, 2 * MINUTE)
    const late = await api(`/api/invitations/${token}`)
    expect(late.status).toBe(410)
    expect(late.body.message).toMatch(/expired/)
  })
})

describe('a password-reset link', () => {
  it('is stored with the README\'s life, sets a password a minute before its end and answers 410 a minute after', async () => {
    const { people: [p] } = await makeShop('Lifetime Resets', [{ role: 'viewer', name: 'Rae Reset' }])
    const userId = p!.id
    const ask = async () => {
      const seen = await mailFilesTo(p!.email)
      expect((await api('/api/auth/forgot', { method: 'POST', body: { email: p!.email }, address: freshAddress() })).status).toBe(202)
      return tokenOf((await waitForMail(p!.email, /password/i, seen)).link)
    }
    const open = `user_id = $1 and used_at is null and id = (select id from password_resets where user_id = $1 and used_at is null order by created_at desc limit 1)`
    const first = await ask()
    const [row] = await testSql<{ seconds: number }[]>(`select extract(epoch from (expires_at - created_at))::float8 as seconds from password_resets where ${open}`, [userId])
    expect(Math.abs(row!.seconds - life.reset)).toBeLessThan(MINUTE)
    await testSql(`update password_resets set created_at = created_at - make_interval(secs => $2), expires_at = expires_at - make_interval(secs => $2) where ${open}`, [userId, life.reset - MINUTE])
    expect((await api('/api/auth/reset', { method: 'POST', body: { token: first, password: 'a new password inside its hour' } })).status).toBe(200)

    const second = await ask()
    await testSql(`update password_resets set created_at = created_at - make_interval(secs => $2), expires_at = expires_at - make_interval(secs => $2) where ${open}`, [userId, life.reset + MINUTE])
    const late = await api('/api/auth/reset', { method: 'POST', body: { token: second, password: 'a new password past its hour' } })
    expect(late.status).toBe(410)
    expect(late.body.message).toMatch(/expired/)
  })
})

describe('a session', () => {
  it('is stored with the README\'s idle and maximum lives', async () => {
    const { people: [p] } = await makeShop('Lifetime Rows', [{ role: 'viewer', name: 'Row Life' }])
    const cookie = await signInAs(p!.email, p!.password)
    const [row] = await testSql<{ idle: number; seconds: number }[]>('select idle_timeout_minutes as idle, extract(epoch from (expires_at - created_at))::float8 as seconds from sessions where id = $1', [await sessionRowId(cookie)])
    expect(row!.idle * MINUTE).toBe(life.idle)
    expect(Math.abs(row!.seconds - life.max)).toBeLessThan(MINUTE)
  })

  it('left unused a minute less than the idle life still works; a minute more, it answers 401', async () => {
    const { people: [p] } = await makeShop('Lifetime Idle', [{ role: 'viewer', name: 'Ida Idle' }])
    const cookie = await signInAs(p!.email, p!.password)
    const id = await sessionRowId(cookie)
    await shift('sessions', ['last_seen_at'], 'id', id, life.idle - MINUTE)
    expect((await api('/api/me', { cookie })).status).toBe(200)
    // That use counted: the idle clock starts again from now.
    const [seen] = await testSql<{ ago: number }[]>('select extract(epoch from (now() - last_seen_at))::float8 as ago from sessions where id = $1', [id])
    expect(seen!.ago).toBeLessThan(MINUTE)
    await shift('sessions', ['last_seen_at'], 'id', id, life.idle + MINUTE)
    expect((await api('/api/me', { cookie })).status).toBe(401)
  })

  it('in use all along, works a minute before the maximum life and answers 401 a minute after', async () => {
    const { people: [p] } = await makeShop('Lifetime Max', [{ role: 'viewer', name: 'Max Life' }])
    const cookie = await signInAs(p!.email, p!.password)
    const id = await sessionRowId(cookie)
    await shift('sessions', ['created_at', 'expires_at'], 'id', id, life.max - MINUTE)
    expect((await api('/api/me', { cookie })).status).toBe(200)
    await shift('sessions', ['created_at', 'expires_at'], 'id', id, 2 * MINUTE)
    expect((await api('/api/me', { cookie })).status).toBe(401)
  })
})
