import { describe, expect, it } from 'vitest'
import { api, demo, freshAddress, signIn } from './support/api'
import { LIMIT_USER } from './support/fixtures'

describe('sign-in', () => {
  it('signs in each demo account with its role and shop', async () => {
    for (const [role, email] of Object.entries(demo)) {
      const res = await api('/api/auth/login', { method: 'POST', body: { email, password: 'rootplate-demo' }, address: freshAddress() })
      expect(res.status).toBe(200)
      expect(res.body.role).toBe(role)
      expect(res.body.shopName).toBe('Alder Street Players')
      expect(res.headers.getSetCookie().some(c => c.startsWith('nuxt-session='))).toBe(true)
    }
  })

  it('accepts the e-mail in any case and with spaces around it', async () => {
    const res = await api('/api/auth/login', { method: 'POST', body: { email: '  Designer@RootPlate.test ', password: 'rootplate-demo' }, address: freshAddress() })
    expect(res.status).toBe(200)
  })

  it('answers 401 for a wrong password and for an unknown account, with the same message', async () => {
    const wrong = await api('/api/auth/login', { method: 'POST', body: { email: demo.viewer, password: 'nope' }, address: freshAddress() })
    const unknown = await api('/api/auth/login', { method: 'POST', body: { email: 'nobody@rootplate.test', password: 'nope' }, address: freshAddress() })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(wrong.body.message).toBe(unknown.body.message)
  })

  it('answers 422 with field messages for a malformed e-mail or an empty password', async () => {
    const res = await api('/api/auth/login', { method: 'POST', body: { email: 'not-an-email', password: '' }, address: freshAddress() })
    expect(res.status).toBe(422)
    expect(res.body.data.fields.email).toMatch(/e-mail/i)
    expect(res.body.data.fields.password).toMatch(/password/i)
  })

  it('answers 400 for a body that is not JSON', async () => {
    const res = await api('/api/auth/login', { method: 'POST', rawBody: '{"email":', address: freshAddress() })
    expect(res.status).toBe(400)
  })

  it('limits failed sign-ins per account: the 11th try within 15 minutes is refused even with the right password', async () => {
    const email = LIMIT_USER.email
    for (let i = 0; i < 10; i++) {
      const res = await api('/api/auth/login', { method: 'POST', body: { email, password: `wrong-${i}` }, address: freshAddress() })
      expect(res.status).toBe(401)
    }
    const blocked = await api('/api/auth/login', { method: 'POST', body: { email, password: LIMIT_USER.password }, address: freshAddress() })
    expect(blocked.status).toBe(429)
    expect(blocked.body.message).toMatch(/too many failed sign-ins/i)
    expect(blocked.headers.get('retry-after')).toBe('900')
  })

  it('limits failed sign-ins per address across accounts', async () => {
    const address = '203.0.113.77'
    for (let i = 0; i < 10; i++) {
      const res = await api('/api/auth/login', { method: 'POST', body: { email: `guess-${i}@rootplate.test`, password: 'x' }, address })
      expect(res.status).toBe(401)
    }
    const blocked = await api('/api/auth/login', { method: 'POST', body: { email: demo.lead, password: 'rootplate-demo' }, address })
    expect(blocked.status).toBe(429)
    const elsewhere = await api('/api/auth/login', { method: 'POST', body: { email: demo.lead, password: 'rootplate-demo' }, address: freshAddress() })
    expect(elsewhere.status).toBe(200)
  })

  it('signs out on the server: the ORIGINAL cookie, sent again, answers 401', async () => {
    const cookie = await signIn(demo.viewer)
    expect((await api('/api/designs', { cookie })).status).toBe(200)
    const out = await api('/api/auth/logout', { method: 'POST', cookie })
    expect(out.status).toBe(200)
    // Re-sending the cookie from before sign-out, as a stolen copy would be.
    const after = await api('/api/designs', { cookie })
    expect(after.status).toBe(401)
  })
})
