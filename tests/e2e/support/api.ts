import { inject } from 'vitest'

export const DEMO_PASSWORD = 'rootplate-demo'
export const demo = {
  lead: 'lead@rootplate.test',
  designer: 'designer@rootplate.test',
  builder: 'builder@rootplate.test',
  viewer: 'viewer@rootplate.test',
} as const
export type DemoRole = keyof typeof demo

export interface Reply<T = any> { status: number; body: T; headers: Headers }

/** A client address of its own (documentation ranges, RFC 5737), so the sign-in limit of one test never touches another. */
export function freshAddress(): string {
  const n = crypto.getRandomValues(new Uint16Array(1))[0]!
  return `198.51.${n >> 8}.${n & 0xff}`
}

export async function api<T = any>(path: string, opts: { method?: string; body?: unknown; rawBody?: string; cookie?: string; address?: string } = {}): Promise<Reply<T>> {
  const headers: Record<string, string> = {}
  if (opts.cookie) headers.cookie = opts.cookie
  if (opts.address) headers['x-forwarded-for'] = opts.address
  let body: string | undefined
  if (opts.rawBody !== undefined) {
    body = opts.rawBody
    headers['content-type'] = 'application/json'
  }
  else if (opts.body !== undefined) {
    body = JSON.stringify(opts.body)
    headers['content-type'] = 'application/json'
  }
  const res = await fetch(`${inject('baseUrl')}${path}`, { method: opts.method ?? 'GET', headers, body, redirect: 'manual' })
  const text = await res.text()
  let parsed: unknown = text
  try { parsed = text ? JSON.parse(text) : null }
  catch { /* not JSON: keep the text */ }
  return { status: res.status, body: parsed as T, headers: res.headers }
}

/** Signs in and returns the session cookie. */
export async function signIn(email: string, password = DEMO_PASSWORD): Promise<string> {
  const res = await fetch(`${inject('baseUrl')}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-forwarded-for': freshAddress() },
    body: JSON.stringify({ email, password }),
  })
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${await res.text()}`)
  const cookies = res.headers.getSetCookie().map(c => c.split(';')[0]).filter(Boolean)
  if (!cookies.length) throw new Error('sign-in set no cookie')
  return cookies.join('; ')
}
