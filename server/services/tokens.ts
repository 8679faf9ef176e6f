import { createHash, randomBytes } from 'node:crypto'

/** A random secret for a link or cookie (256 bits, URL-safe) and the hash we store instead of it. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashToken(token) }
}

// SHA-256 is enough here: the tokens are long and random, so there is nothing
// to brute-force, and a plain hash keeps the lookup a single indexed equality.
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

/** Tokens we hand out are 43 base64url characters; anything else names nothing. */
export function looksLikeToken(value: unknown): value is string {
  return typeof value === 'string' && /^[\w-]{43}$/.test(value)
}
