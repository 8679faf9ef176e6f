import type { Database } from '../utils/db'

/**
 * Sign-in limits: growing delays, never a lock-out.
 *
 * Every try is counted against two buckets, its client address and its
 * account (the e-mail, known or not), and passes them as two queues, the
 * address first. The first FREE_FAILURES failures of a bucket pass at once.
 * Past them, tries of that bucket pass one at a time, each after a pause that
 * doubles from FIRST_DELAY_MS up to MAX_DELAY_MS: the request waits for its
 * turn and then goes on, so the right password still gets in, only later. A
 * try whose turn in a queue is more than MAX_WAIT_MS away is answered 429 and
 * goes no further (it does not join the next queue).
 *
 * The address queue in front is what keeps the account's queue short: one
 * address, however fast it sends, reaches the account at most once per pause,
 * and each of its tries there adds at most one pause, which is shorter than
 * MAX_WAIT_MS. So a steady guesser from one address never pushes the
 * account's next turn out of reach, and the owner's try from their own
 * address is checked (and, with the right password, accepted). Only many
 * addresses at once can fill the account's queue, and that flood is what the
 * limit is there to slow.
 *
 * A bucket is forgotten once it has had no failure for WINDOW_MINUTES, and a
 * right password clears its account's bucket. A try that is still being
 * checked already counts, so parallel tries cannot pass the count: each
 * bucket is claimed under a row lock before the check.
 */
export const SIGN_IN_LIMITS = {
  FREE_FAILURES: 10,
  WINDOW_MINUTES: 15,
  FIRST_DELAY_MS: 250,
  MAX_DELAY_MS: 4_000,
  MAX_WAIT_MS: 5_000,
} as const

export type Claim =
  | { ok: true; /** Milliseconds to wait before going on. */ waitMs: number; /** Whether the bucket was past its free tries. */ overLimit: boolean; retryAfterMs: number }
  | { ok: false; retryAfterMs: number }

/** The pause after the k-th try past the free ones (k >= 1). */
export function delayAfter(k: number, limits = SIGN_IN_LIMITS): number {
  return Math.min(limits.MAX_DELAY_MS, limits.FIRST_DELAY_MS * 2 ** Math.max(0, k - 1))
}

/** [account, address]; a try passes the address's queue first (see claimInTurn). */
export function bucketKeys(email: string, address: string): string[] {
  return [`account:${email}`, `address:${address}`]
}

/**
 * Claims one try in one bucket, atomically: the row is locked, the turn
 * worked out and the count raised before the lock is released. A refused try
 * (turn out of reach) is not counted.
 */
export async function claimBucket(db: Database, key: string, limits = SIGN_IN_LIMITS): Promise<Claim> {
  // Quiet buckets are forgotten here, so the table never outgrows the current attacks. Rows another try
  // holds are skipped, never waited for: two claims never lock each other's rows in turn (no deadlock).
  await db.$client`delete from sign_in_limits where key in (
    select key from sign_in_limits where updated_at < now() - make_interval(mins => ${limits.WINDOW_MINUTES}) for update skip locked)`
  return db.$client.begin(async (sql) => {
    // One statement makes or locks the row, so a bucket cannot vanish between them; one that went quiet
    // for the whole window (and was not yet forgotten) starts afresh.
    const [row] = await sql<{ failures: number; next_ms: number }[]>`
      insert into sign_in_limits (key) values (${key})
      on conflict (key) do update set
        failures = case when sign_in_limits.updated_at < now() - make_interval(mins => ${limits.WINDOW_MINUTES}) then 0 else sign_in_limits.failures end,
        next_at = case when sign_in_limits.updated_at < now() - make_interval(mins => ${limits.WINDOW_MINUTES}) then now() else sign_in_limits.next_at end
      returning failures, (extract(epoch from (next_at - now())) * 1000)::float8 as next_ms`
    if (!row) throw new Error('sign-in bucket not made')
    // Times relative to the database's now(), so the server's clock never enters.
    const overLimit = row.failures >= limits.FREE_FAILURES
    const turn = overLimit ? Math.max(0, row.next_ms) : 0
    if (turn > limits.MAX_WAIT_MS) return { ok: false, retryAfterMs: turn }
    const tries = row.failures + 1
    const past = tries - limits.FREE_FAILURES + 1
    if (past >= 1) {
      // This try holds the bucket's turn; the next one comes a (doubled) pause after it.
      const next = turn + delayAfter(past, limits)
      await sql`update sign_in_limits set failures = ${tries}, next_at = now() + make_interval(secs => ${next / 1000}), updated_at = now() where key = ${key}`
      return { ok: true, waitMs: turn, overLimit, retryAfterMs: next }
    }
    await sql`update sign_in_limits set failures = ${tries}, updated_at = now() where key = ${key}`
    return { ok: true, waitMs: 0, overLimit, retryAfterMs: 0 }
  }) as Promise<Claim>
}

/**
 * Passes the queues in order (the address's, then the account's), waiting for
 * each turn; stops at the first that is out of reach.
 */
export async function claimInTurn(db: Database, keys: string[], wait: (ms: number) => Promise<void>, limits = SIGN_IN_LIMITS): Promise<Claim> {
  let overLimit = false
  let retryAfterMs = 0
  for (const key of keys) {
    const claim = await claimBucket(db, key, limits)
    if (!claim.ok) return claim
    if (claim.waitMs > 0) await wait(claim.waitMs)
    overLimit ||= claim.overLimit
    retryAfterMs = Math.max(retryAfterMs, claim.retryAfterMs - claim.waitMs)
  }
  return { ok: true, waitMs: 0, overLimit, retryAfterMs }
}

/** A sign-in try's queues, the address's first. */
export function claimSignIn(db: Database, email: string, address: string, wait: (ms: number) => Promise<void>, limits = SIGN_IN_LIMITS): Promise<Claim> {
  const [account, addr] = bucketKeys(email, address)
  return claimInTurn(db, [addr!, account!], wait, limits)
}

/** After a right password: the account's bucket is cleared; the address keeps its count less this try, which was no failure. */
export async function releaseSignIn(db: Database, email: string, address: string): Promise<void> {
  const [account, addr] = bucketKeys(email, address)
  await db.$client`delete from sign_in_limits where key = ${account!}`
  await db.$client`update sign_in_limits set failures = greatest(failures - 1, 0) where key = ${addr!}`
}
