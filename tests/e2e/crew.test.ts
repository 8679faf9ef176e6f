import { beforeAll, describe, expect, it } from 'vitest'
import { api, demo, freshAddress, signIn, type DemoRole } from './support/api'
import { OTHER_LEAD } from './support/fixtures'
import { cookieValue, makeShop, sessionRowId, setCookieOf, signInAs, tokenOf, uniqueEmail, type TestPerson } from './support/crew'
import { testSql } from './support/db'
import { mailFilesTo, waitForMail } from './support/mail'

const roles = Object.keys(demo) as DemoRole[]
const cookies = {} as Record<DemoRole, string>
let otherLead = ''
// Invitations go into a shop of this file's own, so the demo shop's crew stays as seeded.
const SHOP = 'Birchwood Stage Crew'
let crew: TestPerson[] = []
let crewLead = ''

beforeAll(async () => {
  for (const r of roles) cookies[r] = await signIn(demo[r])
  otherLead = await signIn(OTHER_LEAD.email, OTHER_LEAD.password)
  crew = (await makeShop(SHOP, [{ role: 'lead', name: 'Bree Birch' }, { role: 'builder', name: 'Bo Birch' }])).people
  crewLead = await signInAs(crew[0]!.email, crew[0]!.password)
})

/** Invites an address as this file's shop lead and returns the link from the e-mail that arrives in the fake's folder. */
async function invite(email: string, role: DemoRole) {
  const res = await api('/api/shop/invitations', { method: 'POST', cookie: crewLead, body: { email, role } })
  expect(res.status).toBe(201)
  const caught = await waitForMail(email, new RegExp(`Join ${SHOP}`))
  return { id: res.body.id as string, ...caught }
}

describe('server-side sessions', () => {
  it('the cookie carries only a random session token whose SHA-256 names a sessions row: no role, no user', async () => {
    const value = cookieValue(cookies.designer)
    // 32 random bytes in base64url (RFC 4648 section 5) are 43 characters.
    expect(value).toMatch(/^[\w-]{43}$/)
    expect(Buffer.from(value, 'base64url').toString('latin1')).not.toMatch(/designer|lead|role/)
    const rows = await testSql('select user_id from sessions where id = $1', [await sessionRowId(cookies.designer)])
    expect(rows).toHaveLength(1)
  })

  it('signing out ends the session: the ORIGINAL cookie answers 401 afterwards', async () => {
    const cookie = await signIn(demo.viewer)
    expect((await api('/api/designs', { cookie })).status).toBe(200)
    expect((await api('/api/auth/logout', { method: 'POST', cookie })).status).toBe(200)
    expect((await api('/api/designs', { cookie })).status).toBe(401)
    expect((await api('/api/me', { cookie })).status).toBe(401)
  })

  it('"sign out everywhere" ends every session of the account, and only that account\'s', async () => {
    const { people: [p] } = await makeShop('Everywhere Players', [{ role: 'designer', name: 'Sam Everywhere' }])
    const a = await signInAs(p!.email, p!.password)
    const b = await signInAs(p!.email, p!.password)
    const res = await api('/api/auth/logout-everywhere', { method: 'POST', cookie: a })
    expect(res.status).toBe(200)
    expect(res.body.ended).toBe(2)
    expect((await api('/api/designs', { cookie: a })).status).toBe(401)
    expect((await api('/api/designs', { cookie: b })).status).toBe(401)
    expect((await api('/api/designs', { cookie: cookies.designer })).status).toBe(200)
    expect((await api('/api/auth/logout-everywhere', { method: 'POST' })).status).toBe(401)
  })

  it('a session left idle longer than its idle timeout answers 401', async () => {
    const { people: [p] } = await makeShop('Idle Players', [{ role: 'viewer', name: 'Ida Idle' }])
    const cookie = await signInAs(p!.email, p!.password)
    expect((await api('/api/me', { cookie })).status).toBe(200)
    const id = await sessionRowId(cookie)
    const aged = await testSql(`update sessions set last_seen_at = now() - make_interval(mins => idle_timeout_minutes + 1) where id = $1 returning id`, [id])
    expect(aged).toHaveLength(1)
    expect((await api('/api/me', { cookie })).status).toBe(401)
  })

  it('a session past its end answers 401 however recently it was used', async () => {
    const { people: [p] } = await makeShop('Expiry Players', [{ role: 'viewer', name: 'Eli Expiry' }])
    const cookie = await signInAs(p!.email, p!.password)
    await testSql(`update sessions set expires_at = now() - interval '1 second' where id = $1`, [await sessionRowId(cookie)])
    expect((await api('/api/me', { cookie })).status).toBe(401)
  })

  it('a changed password ends the account\'s other sessions but keeps this one', async () => {
    const { people: [p] } = await makeShop('Change Players', [{ role: 'designer', name: 'Cam Change' }])
    const here = await signInAs(p!.email, p!.password)
    const there = await signInAs(p!.email, p!.password)
    const wrong = await api('/api/me/password', { method: 'POST', cookie: here, body: { current: 'not it', password: 'a-new-long-password' } })
    expect(wrong.status).toBe(422)
    expect(wrong.body.data.fields.current).toMatch(/current password/)
    const short = await api('/api/me/password', { method: 'POST', cookie: here, body: { current: p!.password, password: 'short' } })
    expect(short.status).toBe(422)
    expect(short.body.data.fields.password).toMatch(/at least 10/)
    const ok = await api('/api/me/password', { method: 'POST', cookie: here, body: { current: p!.password, password: 'a-new-long-password' } })
    expect(ok.status).toBe(200)
    expect(ok.body.endedSessions).toBe(1)
    expect((await api('/api/me', { cookie: here })).status).toBe(200)
    expect((await api('/api/me', { cookie: there })).status).toBe(401)
    await signInAs(p!.email, 'a-new-long-password')
    expect((await api('/api/me/password', { method: 'POST', body: { current: 'x', password: 'y' } })).status).toBe(401)
  })

  it('GET /api/me answers the member with e-mail, name and role, and 401 without a session', async () => {
    const me = await api('/api/me', { cookie: cookies.builder })
    expect(me.status).toBe(200)
    expect(me.body).toMatchObject({ email: demo.builder, role: 'builder' })
    expect(typeof me.body.name).toBe('string')
    expect((await api('/api/me')).status).toBe(401)
  })
})

describe('invitations', () => {
  it.each(['designer', 'builder', 'viewer'] as const)('a %s may not invite, list, resend or withdraw (403)', async (role) => {
    expect((await api('/api/shop/invitations', { method: 'POST', cookie: cookies[role], body: { email: uniqueEmail('x'), role: 'viewer' } })).status).toBe(403)
    expect((await api('/api/shop/invitations', { cookie: cookies[role] })).status).toBe(403)
    expect((await api('/api/shop/invitations/00000000-0000-4000-8000-000000000000/resend', { method: 'POST', cookie: cookies[role] })).status).toBe(403)
    expect((await api('/api/shop/invitations/00000000-0000-4000-8000-000000000000', { method: 'DELETE', cookie: cookies[role] })).status).toBe(403)
  })

  it.each([
    ['POST', '/api/shop/invitations'],
    ['GET', '/api/shop/invitations'],
    ['POST', '/api/shop/invitations/00000000-0000-4000-8000-000000000000/resend'],
    ['DELETE', '/api/shop/invitations/00000000-0000-4000-8000-000000000000'],
    ['PATCH', '/api/shop/members/00000000-0000-4000-8000-000000000000'],
    ['DELETE', '/api/shop/members/00000000-0000-4000-8000-000000000000'],
    ['GET', '/api/shop/activity'],
    ['GET', '/api/dev/mail'],
    ['POST', '/api/auth/logout-everywhere'],
    ['POST', '/api/me/password'],
  ])('%s %s answers 401 without a session', async (method, path) => {
    expect((await api(path, { method, body: method === 'GET' || method === 'DELETE' ? undefined : {} })).status).toBe(401)
  })

  it('answers 422 with field messages for a bad address or role', async () => {
    const res = await api('/api/shop/invitations', { method: 'POST', cookie: crewLead, body: { email: 'nobody', role: 'boss' } })
    expect(res.status).toBe(422)
    expect(res.body.data.fields.email).toMatch(/e-mail/)
    expect(res.body.data.fields.role).toMatch(/lead, designer, builder, viewer/)
  })

  it('answers 409 for someone already in the crew', async () => {
    const res = await api('/api/shop/invitations', { method: 'POST', cookie: crewLead, body: { email: crew[1]!.email.toUpperCase(), role: 'viewer' } })
    expect(res.status).toBe(409)
    expect(res.body.data.fields.email).toMatch(/already in your crew/)
  })

  it('mails a link with a plain-text and an HTML part naming the shop; the link sets a name and password once', async () => {
    const email = uniqueEmail('newcomer')
    const inv = await invite(email, 'designer')
    expect(inv.text).toContain(SHOP)
    expect(inv.html).toContain(SHOP)
    expect(inv.html).toContain(inv.link)
    expect(inv.link).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/join\/[\w-]{43}$/)
    // Only the token's hash is stored (SHA-256 of the link's token, computed here independently).
    const rows = await testSql<{ token_hash: string }[]>('select token_hash from invitations where id = $1', [inv.id])
    expect(rows[0]!.token_hash).not.toBe(tokenOf(inv.link))
    expect(rows[0]!.token_hash).toMatch(/^[0-9a-f]{64}$/)

    const pending = await api('/api/shop/invitations', { cookie: crewLead })
    expect(pending.body.map((i: { email: string }) => i.email)).toContain(email)
    expect((await api('/api/shop/invitations', { method: 'POST', cookie: crewLead, body: { email, role: 'viewer' } })).status).toBe(409)

    const token = tokenOf(inv.link)
    const seen = await api(`/api/invitations/${token}`)
    expect(seen.status).toBe(200)
    expect(seen.body).toMatchObject({ email, role: 'designer', shopName: SHOP })
    expect(seen.body).not.toHaveProperty('hasAccount')

    const noName = await api(`/api/invitations/${token}/accept`, { method: 'POST', body: { password: 'long-enough-pass' } })
    expect(noName.status).toBe(422)
    const weak = await api(`/api/invitations/${token}/accept`, { method: 'POST', body: { name: 'Nia Newcomer', password: 'short' } })
    expect(weak.status).toBe(422)
    expect(weak.body.data.fields.password).toMatch(/at least 10/)

    const accepted = await api(`/api/invitations/${token}/accept`, { method: 'POST', body: { name: 'Nia Newcomer', password: 'long-enough-pass' } })
    expect(accepted.status).toBe(200)
    expect(accepted.body.joined).toBe('new-account')
    const me = await api('/api/me', { cookie: setCookieOf(accepted.headers) })
    expect(me.body).toMatchObject({ email, name: 'Nia Newcomer', role: 'designer' })

    // Used once: the same link now answers 410, and is gone from the pending list.
    expect((await api(`/api/invitations/${token}`)).status).toBe(410)
    expect((await api(`/api/invitations/${token}/accept`, { method: 'POST', body: { name: 'Again', password: 'long-enough-pass' } })).status).toBe(410)
    const after = await api('/api/shop/invitations', { cookie: crewLead })
    expect(after.body.map((i: { email: string }) => i.email)).not.toContain(email)
    const signedIn = await signInAs(email, 'long-enough-pass')
    expect((await api('/api/me', { cookie: signedIn })).body.role).toBe('designer')
  })

  it('an address that already has an account joins with it, from a session of that account, instead of making a second account', async () => {
    const { people: [p] } = await makeShop('Joiner Players', [{ role: 'lead', name: 'Jo Joiner' }])
    const inv = await invite(p!.email, 'builder')
    const token = tokenOf(inv.link)
    expect((await api(`/api/invitations/${token}`)).body).not.toHaveProperty('hasAccount')
    // Signed out, even the right password does not join: sign in first, through the limited sign-in.
    const signedOut = await api(`/api/invitations/${token}/accept`, { method: 'POST', body: { name: 'Jo Joiner', password: p!.password } })
    expect(signedOut.status).toBe(409)
    expect(signedOut.body.data.code).toBe('sign-in-required')
    const ok = await api(`/api/invitations/${token}/accept`, { method: 'POST', body: {}, cookie: await signInAs(p!.email, p!.password) })
    expect(ok.status).toBe(200)
    expect(ok.body.joined).toBe('existing-account')
    const me = await api('/api/me', { cookie: setCookieOf(ok.headers) })
    expect(me.body).toMatchObject({ userId: p!.id, role: 'builder', shopName: SHOP })
    const count = await testSql<{ n: number }[]>('select count(*)::int as n from users where lower(email) = lower($1)', [p!.email])
    expect(count[0]!.n).toBe(1)
    const shopsOf = await testSql<{ n: number }[]>('select count(*)::int as n from memberships where user_id = $1', [p!.id])
    expect(shopsOf[0]!.n).toBe(2)
  })

  it('an account in two shops lists them and moves between them; a shop not its own is a 404', async () => {
    const { shopId: homeId, people: [p] } = await makeShop('Two-shop Players', [{ role: 'designer', name: 'Tam Twoshops' }])
    const inv = await invite(p!.email, 'viewer')
    const joined = await api(`/api/invitations/${tokenOf(inv.link)}/accept`, { method: 'POST', body: {}, cookie: await signInAs(p!.email, p!.password) })
    const cookie = setCookieOf(joined.headers)
    const list = await api('/api/me/shops', { cookie })
    expect(list.status).toBe(200)
    expect(list.body.map((s: { name: string; role: string; current: boolean }) => [s.name, s.role, s.current])).toEqual([['Two-shop Players', 'designer', false], [SHOP, 'viewer', true]])
    const moved = await api('/api/auth/shop', { method: 'POST', cookie, body: { shopId: homeId } })
    expect(moved.status).toBe(200)
    const there = setCookieOf(moved.headers)
    expect((await api('/api/me', { cookie: there })).body).toMatchObject({ shopName: 'Two-shop Players', role: 'designer' })
    expect((await api('/api/me', { cookie })).status).toBe(401)
    const { shopId: strangerShop } = await makeShop('Stranger Players', [{ role: 'lead', name: 'Sol Stranger' }])
    expect((await api('/api/auth/shop', { method: 'POST', cookie: there, body: { shopId: strangerShop } })).status).toBe(404)
    expect((await api('/api/auth/shop', { method: 'POST', cookie: there, body: { shopId: 'x' } })).status).toBe(422)
    expect((await api('/api/auth/shop', { method: 'POST', body: { shopId: homeId } })).status).toBe(401)
    expect((await api('/api/me/shops')).status).toBe(401)
  })

  it('resending makes a new link (the old one stops working); withdrawing ends it', async () => {
    const email = uniqueEmail('resend')
    const first = await invite(email, 'viewer')
    const seen = await mailFilesTo(email)
    expect((await api(`/api/shop/invitations/${first.id}/resend`, { method: 'POST', cookie: crewLead })).status).toBe(200)
    const second = await waitForMail(email, new RegExp(`Join ${SHOP}`), seen)
    expect(second.link).not.toBe(first.link)
    expect((await api(`/api/invitations/${tokenOf(first.link)}`)).status).toBe(404)
    expect((await api(`/api/invitations/${tokenOf(second.link)}`)).status).toBe(200)

    // Another shop's lead cannot see, resend or withdraw it.
    expect((await api('/api/shop/invitations', { cookie: otherLead })).body.map((i: { email: string }) => i.email)).not.toContain(email)
    expect((await api(`/api/shop/invitations/${first.id}/resend`, { method: 'POST', cookie: otherLead })).status).toBe(404)
    expect((await api(`/api/shop/invitations/${first.id}`, { method: 'DELETE', cookie: otherLead })).status).toBe(404)

    expect((await api(`/api/shop/invitations/${first.id}`, { method: 'DELETE', cookie: crewLead })).status).toBe(204)
    expect((await api(`/api/invitations/${tokenOf(second.link)}`)).status).toBe(404)
    expect((await api(`/api/invitations/${tokenOf(second.link)}/accept`, { method: 'POST', body: { name: 'Late', password: 'long-enough-pass' } })).status).toBe(404)
    expect((await api(`/api/shop/invitations/${first.id}`, { method: 'DELETE', cookie: crewLead })).status).toBe(404)
  })

  it('an invitation older than seven days answers 410', async () => {
    const email = uniqueEmail('late')
    const inv = await invite(email, 'viewer')
    // The invitation was issued with a seven-day life: its end less its making (not its age, which is nought).
    const life = await testSql<{ seconds: number }[]>(`select extract(epoch from (expires_at - created_at))::float8 as seconds from invitations where id = $1`, [inv.id])
    expect(Math.abs(life[0]!.seconds - 7 * 86_400)).toBeLessThan(60)
    await testSql(`update invitations set expires_at = now() - interval '1 minute' where id = $1`, [inv.id])
    expect((await api(`/api/invitations/${tokenOf(inv.link)}`)).status).toBe(410)
    const res = await api(`/api/invitations/${tokenOf(inv.link)}/accept`, { method: 'POST', body: { name: 'Late', password: 'long-enough-pass' } })
    expect(res.status).toBe(410)
    expect(res.body.message).toMatch(/expired/)
  })

  it('a malformed or unknown link answers 404', async () => {
    expect((await api('/api/invitations/short')).status).toBe(404)
    expect((await api(`/api/invitations/${'a'.repeat(43)}`)).status).toBe(404)
  })
})

describe('password reset', () => {
  it('answers the same whether or not the address exists, and mails only a real account', async () => {
    const { people: [p] } = await makeShop('Reset Players', [{ role: 'designer', name: 'Rae Reset' }])
    const unknown = uniqueEmail('nobody')
    const a = await api('/api/auth/forgot', { method: 'POST', body: { email: p!.email }, address: freshAddress() })
    const b = await api('/api/auth/forgot', { method: 'POST', body: { email: unknown }, address: freshAddress() })
    expect(a.status).toBe(202)
    expect(b.status).toBe(202)
    expect(a.body).toEqual(b.body)
    const mail = await waitForMail(p!.email, /new Rootplate password/)
    expect(mail.text).toContain('Reset Players')
    expect(mail.html).toContain(mail.link)
    expect(await mailFilesTo(unknown)).toEqual([])
  })

  it('sends at most three reset e-mails an hour to one account, answering every request the same', async () => {
    const { people: [p] } = await makeShop('Flood Players', [{ role: 'viewer', name: 'Fen Flood' }])
    const answers = []
    // From an address of its own: the per-address cap on reset requests is not this test's subject.
    const address = freshAddress()
    for (let i = 0; i < 5; i++) answers.push(await api('/api/auth/forgot', { method: 'POST', body: { email: p!.email }, address }))
    expect(answers.map(a => a.status)).toEqual([202, 202, 202, 202, 202])
    expect(new Set(answers.map(a => JSON.stringify(a.body))).size).toBe(1)
    // The answer goes first and the link is made after it (so known and unknown addresses answer alike): wait
    // for the rows; the cap that stops the fourth and fifth is checked under 60 at once in accounts-hardening.
    await expect.poll(async () => (await testSql<{ n: number }[]>('select count(*)::int as n from password_resets where user_id = $1', [p!.id]))[0]!.n).toBe(3)
    const seen: string[] = []
    const links = new Set<string>()
    for (let i = 0; i < 3; i++) {
      const mail = await waitForMail(p!.email, /new Rootplate password/, seen)
      seen.push(mail.file)
      links.add(mail.link)
    }
    expect(links.size).toBe(3)
  })

  it('the link sets a new password once, within an hour, and ends every session of the account', async () => {
    const { people: [p] } = await makeShop('Reset Two Players', [{ role: 'builder', name: 'Rio Reset' }])
    const old = await signInAs(p!.email, p!.password)
    await api('/api/auth/forgot', { method: 'POST', body: { email: p!.email }, address: freshAddress() })
    const mail = await waitForMail(p!.email, /new Rootplate password/)
    const token = tokenOf(mail.link)
    const weak = await api('/api/auth/reset', { method: 'POST', body: { token, password: 'short' } })
    expect(weak.status).toBe(422)
    const ok = await api('/api/auth/reset', { method: 'POST', body: { token, password: 'brand-new-password' } })
    expect(ok.status).toBe(200)
    expect((await api('/api/me', { cookie: old })).status).toBe(401)
    await signInAs(p!.email, 'brand-new-password')
    const again = await api('/api/auth/reset', { method: 'POST', body: { token, password: 'another-new-password' } })
    expect(again.status).toBe(410)
    expect(again.body.message).toMatch(/already been used/)

    // A second link, aged past its hour.
    const seen = await mailFilesTo(p!.email)
    await api('/api/auth/forgot', { method: 'POST', body: { email: p!.email }, address: freshAddress() })
    const late = await waitForMail(p!.email, /new Rootplate password/, seen)
    await testSql(`update password_resets set expires_at = now() - interval '1 second' where user_id = $1 and used_at is null`, [p!.id])
    const expired = await api('/api/auth/reset', { method: 'POST', body: { token: tokenOf(late.link), password: 'another-new-password' } })
    expect(expired.status).toBe(410)
    expect(expired.body.message).toMatch(/expired/)
    expect((await api('/api/auth/reset', { method: 'POST', body: { token: 'b'.repeat(43), password: 'another-new-password' } })).status).toBe(404)
    expect((await api('/api/auth/reset', { method: 'POST', body: { token: 'x', password: 'another-new-password' } })).status).toBe(422)
  })
})

describe('roles and removal', () => {
  it('the lead changes a role; the member\'s same cookie has the new role on the next request', async () => {
    const { people: [lead, d] } = await makeShop('Role Players', [{ role: 'lead', name: 'Lee Lead' }, { role: 'designer', name: 'Dee Designer' }])
    const leadCookie = await signInAs(lead!.email, lead!.password)
    const dCookie = await signInAs(d!.email, d!.password)
    expect((await api('/api/designs', { method: 'POST', cookie: dCookie, body: {} })).status).toBe(422)
    const res = await api(`/api/shop/members/${d!.id}`, { method: 'PATCH', cookie: leadCookie, body: { role: 'viewer' } })
    expect(res.status).toBe(200)
    expect((await api('/api/me', { cookie: dCookie })).body.role).toBe('viewer')
    expect((await api('/api/designs', { method: 'POST', cookie: dCookie, body: {} })).status).toBe(403)
    expect((await api(`/api/shop/members/${d!.id}`, { method: 'PATCH', cookie: leadCookie, body: { role: 'chief' } })).status).toBe(422)
    expect((await api(`/api/shop/members/${d!.id}`, { method: 'PATCH', cookie: dCookie, body: { role: 'lead' } })).status).toBe(403)
    expect((await api(`/api/shop/members/${d!.id}`, { method: 'PATCH', cookie: otherLead, body: { role: 'lead' } })).status).toBe(404)
    expect((await api(`/api/shop/members/${d!.id}`, { method: 'DELETE', cookie: otherLead })).status).toBe(404)
    expect((await api('/api/shop/members/not-a-uuid', { method: 'PATCH', cookie: leadCookie, body: { role: 'viewer' } })).status).toBe(404)
  })

  it('a removed member\'s session answers 401 at once', async () => {
    const { people: [lead, b] } = await makeShop('Removal Players', [{ role: 'lead', name: 'Lou Lead' }, { role: 'builder', name: 'Bo Builder' }])
    const leadCookie = await signInAs(lead!.email, lead!.password)
    const bCookie = await signInAs(b!.email, b!.password)
    expect((await api(`/api/shop/members/${b!.id}`, { method: 'DELETE', cookie: leadCookie })).status).toBe(204)
    expect((await api('/api/designs', { cookie: bCookie })).status).toBe(401)
    expect((await api(`/api/shop/members/${b!.id}`, { method: 'DELETE', cookie: leadCookie })).status).toBe(404)
    const left = await api('/api/shop/members', { cookie: leadCookie })
    expect(left.body.map((m: { email: string }) => m.email)).toEqual([lead!.email])
  })

  it('the last lead cannot be demoted or removed (409)', async () => {
    const { people: [lead] } = await makeShop('Lone Players', [{ role: 'lead', name: 'Lone Lead' }])
    const cookie = await signInAs(lead!.email, lead!.password)
    const demote = await api(`/api/shop/members/${lead!.id}`, { method: 'PATCH', cookie, body: { role: 'designer' } })
    expect(demote.status).toBe(409)
    expect(demote.body.message).toMatch(/at least one lead/)
    expect((await api(`/api/shop/members/${lead!.id}`, { method: 'DELETE', cookie })).status).toBe(409)
    expect((await api('/api/me', { cookie })).body.role).toBe('lead')
  })

  it('two leads demoting each other at the same moment leave exactly one lead', async () => {
    for (let round = 0; round < 5; round++) {
      const { shopId, people: [a, b] } = await makeShop(`Race Players ${round}`, [{ role: 'lead', name: 'Ash Lead' }, { role: 'lead', name: 'Bay Lead' }])
      const [ca, cb] = await Promise.all([signInAs(a!.email, a!.password), signInAs(b!.email, b!.password)])
      const answers = await Promise.all([
        api(`/api/shop/members/${b!.id}`, { method: 'PATCH', cookie: ca, body: { role: 'builder' } }),
        api(`/api/shop/members/${a!.id}`, { method: 'PATCH', cookie: cb, body: { role: 'builder' } }),
      ])
      const statuses = answers.map(r => r.status).sort()
      expect(statuses[0]).toBe(200)
      expect([403, 409]).toContain(statuses[1])
      const leads = await testSql<{ n: number }[]>(`select count(*)::int as n from memberships where shop_id = $1 and role = 'lead'`, [shopId])
      expect(leads[0]!.n).toBe(1)
    }
  })
})

describe('activity', () => {
  it.each(['designer', 'builder', 'viewer'] as const)('only the lead may read it (%s: 403)', async (role) => {
    expect((await api('/api/shop/activity', { cookie: cookies[role] })).status).toBe(403)
  })

  it('lists saves, exports and invitations newest first, filtered by design or person, never another shop\'s', async () => {
    const { people: [lead, d] } = await makeShop('Activity Players', [{ role: 'lead', name: 'Ava Lead' }, { role: 'designer', name: 'Dev Designer' }])
    const lc = await signInAs(lead!.email, lead!.password)
    const dc = await signInAs(d!.email, d!.password)
    const one = await api('/api/designs', { method: 'POST', cookie: dc, body: { name: 'Activity stump', params: {} } })
    const two = await api('/api/designs', { method: 'POST', cookie: lc, body: { name: 'Activity column', params: {} } })
    expect(one.status).toBe(201)
    expect(two.status).toBe(201)
    const saved = await api(`/api/designs/${one.body.id}/revisions`, { method: 'POST', cookie: dc, body: { params: {}, note: 'wider lobes', basedOn: 1 } })
    expect(saved.status).toBe(201)
    expect((await api(`/api/revisions/${saved.body.id}/cut.dxf?units=mm`, { cookie: dc })).status).toBe(200)
    // The export's entry may be written just after its file is sent: wait for it before the next action, so the order is the one asked.
    await expect.poll(async () => (await api(`/api/shop/activity?person=${d!.id}`, { cookie: lc })).body.map((a: { action: string }) => a.action)[0], { timeout: 15_000 }).toBe('export')
    expect((await api('/api/shop/invitations', { method: 'POST', cookie: lc, body: { email: uniqueEmail('act'), role: 'viewer' } })).status).toBe(201)

    const all = await api('/api/shop/activity', { cookie: lc })
    expect(all.status).toBe(200)
    const actions = all.body.map((a: { action: string }) => a.action)
    expect(actions.slice(0, 5)).toEqual(['invitation.sent', 'export', 'revision.saved', 'design.created', 'design.created'])
    const times = all.body.map((a: { createdAt: string }) => Date.parse(a.createdAt))
    expect([...times].sort((x, y) => y - x)).toEqual(times)
    const exported = all.body.find((a: { action: string }) => a.action === 'export')
    expect(exported).toMatchObject({ user: { name: 'Dev Designer' }, design: { name: 'Activity stump' }, detail: { file: 'cut.dxf', revision: 2 } })

    const byDesign = await api(`/api/shop/activity?design=${two.body.id}`, { cookie: lc })
    expect(byDesign.body.map((a: { action: string }) => a.action)).toEqual(['design.created'])
    const byPerson = await api(`/api/shop/activity?person=${d!.id}`, { cookie: lc })
    expect(byPerson.body.map((a: { action: string }) => a.action)).toEqual(['export', 'revision.saved', 'design.created'])
    expect((await api('/api/shop/activity?design=nope', { cookie: lc })).status).toBe(422)

    const other = await api('/api/shop/activity', { cookie: otherLead })
    expect(other.body.some((a: { design: { name: string | null } }) => a.design.name === 'Activity stump')).toBe(false)
  })
})

describe('development mail page', () => {
  it('lists the fake\'s messages of the lead\'s own shop only', async () => {
    const email = uniqueEmail('mailpage')
    await invite(email, 'viewer')
    const mine = await api('/api/dev/mail', { cookie: crewLead })
    expect(mine.status).toBe(200)
    const found = mine.body.find((m: { to: string }) => m.to.includes(email))
    expect(found.subject).toBe(`Join ${SHOP} on Rootplate`)
    expect(found.links[0]).toMatch(/\/join\/[\w-]{43}$/)
    const theirs = await api('/api/dev/mail', { cookie: cookies.lead })
    expect(theirs.status).toBe(200)
    expect(theirs.body.some((m: { to: string }) => m.to.includes(email))).toBe(false)
    expect((await api('/api/dev/mail', { cookie: cookies.designer })).status).toBe(403)
    expect((await api('/api/dev/mail', { cookie: otherLead })).body.some((m: { to: string }) => m.to.includes(email))).toBe(false)
  })
})
