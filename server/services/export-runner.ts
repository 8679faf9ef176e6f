// Runs export jobs (and the other costly work: sheet plans, label sheets,
// plate figures) for the routes: the cache first (revisions never change),
// then at most `perOwner` jobs in the making at once for one member (share
// links count against the member who made them), identical requests joined to
// the one already being made, the work on the worker pool (or in this thread
// when there is none), each shop taking its turn in the pool's queue.
import { existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { ByteLru, exportKey } from './export-cache'
import { runExportJob, type ExportJob } from './export-jobs'
import type { ExportPool } from './export-pool'

export const WORKER_FILE_NAME = 'export-worker.mjs'

/** Jobs one member (their share links included) may have in the making at once; more is a 429. */
export const EXPORTS_PER_OWNER = 2
/** Seconds a refused client is asked to wait before it tries again. */
export const EXPORT_RETRY_AFTER = 5
/** Bytes of finished files kept in memory (a 200-sheet template is about 0.5 MB). */
export const EXPORT_CACHE_BYTES = 64 * 1024 * 1024

/** Too many files in the making for one member: answered 429 with Retry-After. */
export class ExportsBusyError extends Error {
  constructor(readonly retryAfter: number) {
    super(`You already have ${EXPORTS_PER_OWNER} files being made (plans, label sheets and your share links count too). Wait for them to finish, then try again.`)
  }
}

/** `madeBy` says where a file made now was written: a pool worker or the server's own thread. */
/** Files waiting for a worker, across all members, past which new ones are turned away for a moment. */
export const EXPORT_QUEUE_MAX = 32

/** The pool's queue is full (many members at once): answered 503 with Retry-After. */
export class ExportsQueueFullError extends Error {
  constructor(readonly retryAfter: number) {
    super('The server is busy making files for others. Try again in a few seconds.')
  }
}

/**
 * Who waits for a job: `key` is the member it counts against (`member:<id>`;
 * a share link's downloads count against the member who made the link), and
 * `shop` the shop whose turn in the pool's queue it takes.
 */
export interface ExportOwner { key: string; shop: string }

export interface ExportResult { body: Uint8Array | string; cache: 'hit' | 'miss'; madeBy?: 'worker' | 'thread' }

export interface ExportRunnerOptions {
  pool: ExportPool | null
  buildStamp: string
  cacheBytes?: number
  perOwner?: number
  /** Jobs waiting for a worker past which new ones are refused (default EXPORT_QUEUE_MAX). */
  queueMax?: number
  /** Writes the file when there is no pool (tests may count calls through it). */
  inThread?: (job: ExportJob) => Promise<Uint8Array | string>
}

export class ExportRunner {
  readonly cache: ByteLru
  /** Files written (not served from the cache): read by tests and the benchmark. */
  builds = 0
  private running = new Map<string, number>()
  private inFlight = new Map<string, Promise<Uint8Array | string>>()
  private perOwner: number
  private inThread: (job: ExportJob) => Promise<Uint8Array | string>

  constructor(readonly options: ExportRunnerOptions) {
    this.cache = new ByteLru(options.cacheBytes ?? EXPORT_CACHE_BYTES)
    this.perOwner = options.perOwner ?? EXPORTS_PER_OWNER
    this.inThread = options.inThread ?? runExportJob
  }

  get pooled(): boolean { return this.options.pool !== null }

  /** Jobs in the making for one owner key (read by tests). */
  runningFor(key: string): number { return this.running.get(key) ?? 0 }

  /**
   * Whether the pool's queue has room for one more job of `shop`. Past
   * `queueMax` waiting jobs, a shop still gets in while it holds less than
   * its fair share of the queue (the queue divided among the shops waiting,
   * itself included), so one busy shop cannot turn every other one away.
   */
  private roomFor(shop: string): boolean {
    const pool = this.options.pool
    if (!pool) return true
    const max = this.options.queueMax ?? EXPORT_QUEUE_MAX
    if (pool.waiting < max) return true
    const mine = pool.waitingFor(shop)
    const shops = pool.groupsWaiting + (mine ? 0 : 1)
    return mine < Math.max(1, Math.floor(max / shops))
  }

  async run(job: ExportJob, who: ExportOwner | string): Promise<ExportResult> {
    // A bare key (scripts, tests) queues with every other bare key, as one shop.
    const owner = typeof who === 'string' ? { key: who, shop: '' } : who
    const key = exportKey(job, this.options.buildStamp)
    const cached = this.cache.get(key)
    if (cached !== undefined) return { body: cached, cache: 'hit' }
    const count = this.running.get(owner.key) ?? 0
    if (count >= this.perOwner) throw new ExportsBusyError(EXPORT_RETRY_AFTER)
    if (!this.inFlight.has(key) && !this.roomFor(owner.shop)) throw new ExportsQueueFullError(EXPORT_RETRY_AFTER)
    this.running.set(owner.key, count + 1)
    try {
      let making = this.inFlight.get(key)
      if (!making) {
        making = this.make(job, owner.shop)
        this.inFlight.set(key, making)
        making.then(body => this.cache.set(key, body), () => {}).finally(() => this.inFlight.delete(key))
      }
      return { body: await making, cache: 'miss', madeBy: this.pooled ? 'worker' : 'thread' }
    }
    finally {
      const left = (this.running.get(owner.key) ?? 1) - 1
      if (left > 0) this.running.set(owner.key, left)
      else this.running.delete(owner.key)
    }
  }

  private make(job: ExportJob, shop: string): Promise<Uint8Array | string> {
    this.builds++
    return this.options.pool ? this.options.pool.run(job, shop) : this.inThread(job)
  }
}

/**
 * The bundled worker beside the server's entry (`.output/server/export-worker.mjs`),
 * found from this chunk's own folder upward; null where there is none (`nuxt dev`,
 * plain Node tests), and the files are then made in the server's thread.
 */
export function findWorkerFile(fromDir: string, levels = 4): string | null {
  let dir = fromDir
  for (let i = 0; i <= levels; i++) {
    const candidate = join(dir, WORKER_FILE_NAME)
    if (existsSync(candidate)) return candidate
    const up = dirname(dir)
    if (up === dir) break
    dir = up
  }
  return null
}
