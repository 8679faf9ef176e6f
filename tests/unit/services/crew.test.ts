import { describe, expect, it } from 'vitest'
import { hashToken, looksLikeToken, newToken } from '../../../server/services/tokens'
import { defaultPolicy, policyFromEnv } from '../../../server/services/sessions'
import { invitationMail, passwordResetMail, shareMail } from '../../../server/services/mail-messages'
import { can, roles } from '../../../shared/utils/permissions'

describe('link and session tokens', () => {
  it('stores SHA-256 of the token (FIPS 180-2 test vector "abc")', () => {
    expect(hashToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad')
  })
  it('hands out 256-bit URL-safe tokens, never the same twice, whose hash is what is kept', () => {
    const a = newToken()
    const b = newToken()
    expect(a.token).toMatch(/^[\w-]{43}$/) // 32 bytes in base64url without padding (RFC 4648 §5)
    expect(a.token).not.toBe(b.token)
    expect(a.hash).toBe(hashToken(a.token))
    expect(looksLikeToken(a.token)).toBe(true)
    expect(looksLikeToken('../etc/passwd')).toBe(false)
  })
})

describe('session policy from the environment', () => {
  it('reads minutes and days, and falls back on anything unreadable', () => {
    expect(policyFromEnv({ SESSION_IDLE_MINUTES: '30', SESSION_MAX_DAYS: '2' })).toEqual({ idleMinutes: 30, maxDays: 2 })
    // Product rule, written by hand from the README ("default 720" minutes idle, "default 30" days), not read from the code.
    const documented = { idleMinutes: 720, maxDays: 30 }
    expect(defaultPolicy).toEqual(documented)
    expect(policyFromEnv({ SESSION_IDLE_MINUTES: 'soon', SESSION_MAX_DAYS: '-1' })).toEqual(documented)
    expect(policyFromEnv({})).toEqual(documented)
    // One readable, one not: each falls back on its own.
    expect(policyFromEnv({ SESSION_IDLE_MINUTES: '0', SESSION_MAX_DAYS: '7' })).toEqual({ idleMinutes: 720, maxDays: 7 })
  })
})

describe('messages', () => {
  const link = 'http://localhost:3000/join/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA'
  it.each([
    ['invitation', invitationMail({ shopName: 'Elm & Ash <Theatre>', inviterName: 'Kit', role: 'builder', link, days: 7 })],
    ['reset', passwordResetMail({ shopName: 'Elm & Ash <Theatre>', name: 'Kit', link })],
    ['share', shareMail({ shopName: 'Elm & Ash <Theatre>', senderName: 'Kit', designName: 'Oak', revision: 3, note: 'Two, please', link, expiresOn: '2026-12-24' })],
  ])('the %s message names the shop and carries the link in both parts, with the HTML escaped', (_kind, mail) => {
    expect(mail.subject).toContain('Elm & Ash <Theatre>')
    expect(mail.text).toContain('Elm & Ash <Theatre>')
    expect(mail.text).toContain(link)
    expect(mail.html).toContain('Elm &amp; Ash &lt;Theatre&gt;')
    expect(mail.html).not.toContain('<Theatre>')
    expect(mail.html).toContain(`href="${link}"`)
  })
})

describe('crew permissions', () => {
  it('lets leads and designers share revisions, and only the lead read the activity', () => {
    expect(roles.filter(r => can(r, 'design:share'))).toEqual(['lead', 'designer'])
    expect(roles.filter(r => can(r, 'shop:activity'))).toEqual(['lead'])
  })
})
