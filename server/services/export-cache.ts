// Finished export files, kept in memory by revision and query. Revisions never
// change, so a file made once stays right; the key also carries the server's
// build, so a new build with changed writers never hands out an old file.
import { createHash } from 'node:crypto'
import type { ExportJob } from './export-jobs'

/** Least recently used first out, bounded by the bytes held rather than by a count. */
export class ByteLru {
  private entries = new Map<string, Uint8Array | string>()
  private held = 0

  constructor(readonly maxBytes: number) {}

  get bytes(): number { return this.held }
  get size(): number { return this.entries.size }

  get(key: string): Uint8Array | string | undefined {
    const value = this.entries.get(key)
    if (value === undefined) return undefined
    // Re-inserting moves the key to the newest end of the Map's order.
    this.entries.delete(key)
    this.entries.set(key, value)
    return value
  }

  set(key: string, value: Uint8Array | string): void {
    const size = sizeOf(value)
    this.delete(key)
    // One file larger than the whole cache is served but not kept.
    if (size > this.maxBytes) return
    this.entries.set(key, value)
    this.held += size
    for (const [oldest, old] of this.entries) {
      if (this.held <= this.maxBytes) break
      this.entries.delete(oldest)
      this.held -= sizeOf(old)
    }
  }

  delete(key: string): void {
    const old = this.entries.get(key)
    if (old === undefined) return
    this.entries.delete(key)
    this.held -= sizeOf(old)
  }

  clear(): void {
    this.entries.clear()
    this.held = 0
  }
}

function sizeOf(value: Uint8Array | string): number {
  return typeof value === 'string' ? Buffer.byteLength(value) : value.byteLength
}

/**
 * The cache key: what the file is made from (kind, the stored revision with its
 * params and names, the parsed query) and the build that makes it. The font is
 * part of the build, so it is left out.
 */
export function exportKey(job: ExportJob, buildStamp: string): string {
  if ('revision' in job && 'query' in job) {
    const { kind, revision, query } = job
    return createHash('sha256').update(JSON.stringify([buildStamp, kind, revision, query])).digest('base64url')
  }
  // The other jobs (plans, labels, plate figures) are keyed by all they carry but
  // the font, and a plan's files by the plan's key rather than its long text.
  const { font: _font, plan: _plan, ...rest } = job as ExportJob & { font?: unknown; plan?: unknown }
  return createHash('sha256').update(JSON.stringify([buildStamp, rest])).digest('base64url')
}
