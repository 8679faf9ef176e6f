import type { Database } from '../utils/db'

/**
 * Sign-in limits: growing delays, never a lock-out.
 *
 * Every try is counted against two buckets, its account (the e-mail, known
 * or not) and its client address. The first FREE_FAILURES failures of a
 * bucket are checked at once. Past them, tries of that bucket are checked one
 * at a time, each after a pause that doubles from FIRST_DELAY_MS up to
 * MAX_DELAY_MS: the request waits for its turn and then has its password
 * checked, so the right password still gets in, only later. A try whose turn
 * is more than MAX_WAIT_MS away (someone is sending many at once) is answered
 * 429 without a check. Since MAX_WAIT_MS is longer than the longest pause,
 * one attacker's slow, steady guessing cannot keep the right person out; only
 * a flood can, and a flood is what the limit is there to slow.
 *
 * A bucket is forgotten once it has had no failure for WINDOW_MINUTES, and a
 * right password clears its account's bucket. A try that is still being
 * checked already counts, so parallel tries cannot pass the count: the
 * buckets are claimed under row locks in one transaction before the check.
 */
export const SIGN_IN_LIMITS = {
  FREE_FAILURES: 10,
  WINDOW_MINUTES: 15,
  FIRST_DELAY_MS: 250,
  MAX_DELAY_MS: 4_000,
  MAX_WAIT_MS: 5_000,
} as const

export type Claim =
  | { ok: true; /** Milliseconds to wait before checking the password. */ waitMs: number; /** Whether any bucket was past its free tries. */ overLimit: boolean; retryAfterMs: number }
  | { ok: false; retryAfterMs: number }

/** The pause after the k-th try past the free ones (k >= 1). */
export function delayAfter(k: number, limits = SIGN_IN_LIMITS): number {
  return Math.min(limits.MAX_DELAY_MS, limits.FIRST_DELAY_MS * 2 ** Math.max(0, k - 1))
}

export function bucketKeys(email: string, address: string): string[] {
  return [`account:${email}`, `address:${address}`]
}

/**
 * Claims one try in each bucket, atomically: the rows are locked (in key
 * order, so two claims never wait on each other crosswise), the turn is
 * worked out and the count raised before the lock is released.
 */
export async function claimSignIn(db: Database, keys: string[], limits = SIGN_IN_LIMITS): Promise<Claim> {
  const sorted = [...new Set(keys)].sort()
  return db.$client.begin(async (sql) => {
    // Quiet buckets are forgotten here, so the table never outgrows the current attacks.
    await sql`delete from sign_in_limits where updated_at < now() - make_interval(mins => ${limits.WINDOW_MINUTES})`
    await sql`insert into sign_in_limits (key) select unnest(${sorted}::text[]) on conflict (key) do nothing`
    const rows = await sql<{ key: string; failures: number; next_ms: number }[]>`
      select key, failures, (extract(epoch from (next_at - now())) * 1000)::float8 as next_ms
      from sign_in_limits where key = any(${sorted}::text[]) order by key for update`
    // Times relative to the database's now(), so the server's clock never enters.
    let turn = 0
    let overLimit = false
    for (const row of rows) {
      if (row.failures >= limits.FREE_FAILURES) {
        overLimit = true
        turn = Math.max(turn, row.next_ms)
      }
    }
    if (turn > limits.MAX_WAIT_MS) return { ok: false, retryAfterMs: turn }
    let retryAfterMs = 0
    for (const row of rows) {
      const tries = row.failures + 1
      const past = tries - limits.FREE_FAILURES + 1
      if (past >= 1) {
        // This try holds the bucket's turn; the next one comes a (doubled) pause after it.
        const next = Math.max(turn, row.next_ms, 0) + delayAfter(past, limits)
        retryAfterMs = Math.max(retryAfterMs, next)
        await sql`update sign_in_limits set failures = ${tries}, next_at = now() + make_interval(secs => ${next / 1000}), updated_at = now() where key = ${row.key}`
      }
      else {
        await sql`update sign_in_limits set failures = ${tries}, updated_at = now() where key = ${row.key}`
      }
    }
    return { ok: true, waitMs: Math.max(0, turn), overLimit, retryAfterMs }
  }) as Promise<Claim>
}

/** After a right password: the account's bucket is cleared; the address keeps its count less this try, which was no failure. */
export async function releaseSignIn(db: Database, email: string, address: string): Promise<void> {
  const [account, addr] = bucketKeys(email, address)
  await db.$client`delete from sign_in_limits where key = ${account!}`
  await db.$client`update sign_in_limits set failures = greatest(failures - 1, 0) where key = ${addr!}`
}

