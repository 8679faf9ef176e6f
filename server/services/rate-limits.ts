import type { Database } from '../utils/db'

/** One cap: at most `max` uses of `key` in a window of `windowSeconds`. */
export interface Limit { key: string; max: number; windowSeconds: number }

export type Taken = { ok: true } | { ok: false; key: string; retryAfterSeconds: number }

class OverLimit extends Error {
  constructor(readonly key: string, readonly retryAfterSeconds: number) { super('over limit') }
}

const HOUR = 3600

/**
 * The caps on what one person may make the server send or do. Per recipient
 * (one mailbox, whoever asks) and per member (one sender, whichever mailbox),
 * so neither a lone address nor a crowd of addresses can be flooded.
 */
export const RATE_LIMITS = {
  /** Reset e-mails to one address: a few an hour is plenty for a person. */
  resetsPerRecipient: { max: 3, windowSeconds: HOUR },
  /** Reset requests from one client address. */
  resetsPerAddress: { max: 20, windowSeconds: HOUR },
  /** Invitations (new or sent again) and share e-mails to one outside address. */
  mailPerRecipient: { max: 5, windowSeconds: HOUR },
  /** Invitations and share e-mails one member sends. */
  mailPerMember: { max: 30, windowSeconds: HOUR },
  /** Comments one member leaves. */
  commentsPerMember: { max: 20, windowSeconds: 60 },
  /** Downloads through one share link, and from one client address through any. */
  downloadsPerShare: { max: 60, windowSeconds: 10 * 60 },
  downloadsPerAddress: { max: 60, windowSeconds: 60 },
} as const

export const limit = (key: string, rule: { max: number; windowSeconds: number }): Limit => ({ key, ...rule })

/**
 * Takes one use of every limit, all or none: each key's row is raised by one
 * INSERT ... ON CONFLICT DO UPDATE (which holds the row's lock to the end of
 * the transaction), and if any count passes its cap the transaction is rolled
 * back, so a refused request counts nowhere. Parallel requests queue on the
 * row lock and see each other's counts: the cap holds exactly.
 */
export async function takeLimits(db: Database, limits: Limit[]): Promise<Taken> {
  // Keys in one order, so two requests never wait on each other crosswise.
  const sorted = [...limits].sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0))
  try {
    await db.$client.begin(async (sql) => {
      for (const l of sorted) {
        const [row] = await sql<{ count: number; left_s: number }[]>`
          insert into rate_limits (key, count, window_end) values (${l.key}, 1, now() + make_interval(secs => ${l.windowSeconds}))
          on conflict (key) do update set
            count = case when rate_limits.window_end <= now() then 1 else rate_limits.count + 1 end,
            window_end = case when rate_limits.window_end <= now() then excluded.window_end else rate_limits.window_end end
          returning count, extract(epoch from (window_end - now()))::float8 as left_s`
        if (!row || row.count > l.max) throw new OverLimit(l.key, Math.max(1, Math.ceil(row?.left_s ?? l.windowSeconds)))
      }
      // Windows long over are forgotten, so the table holds only current counts.
      await sql`delete from rate_limits where window_end < now() - interval '1 hour'`
    })
  }
  catch (err: unknown) {
    if (err instanceof OverLimit) return { ok: false, key: err.key, retryAfterSeconds: err.retryAfterSeconds }
    throw err
  }
  return { ok: true }
}

/** The caps on one message a member sends to an outside address (invitations, share e-mails). */
export function memberMailLimits(memberId: string, recipient: string): Limit[] {
  return [
    limit(`mail-to:${recipient.trim().toLowerCase()}`, RATE_LIMITS.mailPerRecipient),
    limit(`mail-by:${memberId}`, RATE_LIMITS.mailPerMember),
  ]
}
