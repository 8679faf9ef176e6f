// Fair share of the export pool (issue 25 item 3), without HTTP: the pool's
// queue lets the shops take turns, and a full queue still admits a shop that
// holds less than its share. Stand-in workers answer at once, so only the
// order is checked, never a time.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import type { ExportJob } from '../../../server/services/export-jobs'
import { ExportPool } from '../../../server/services/export-pool'
import { ExportRunner, ExportsQueueFullError } from '../../../server/services/export-runner'

const revision = { number: 1, params: {}, designName: 'Fair test ash', sizeLabel: null, createdAt: new Date('2026-03-01T12:00:00Z') }
const job = (tag: string): ExportJob => ({ kind: 'cut-svg', revision: { ...revision, designName: tag }, query: { units: 'in', reference: true, mirror: false, layer: 'all', openings: 'routed' } })

const dir = mkdtempSync(join(tmpdir(), 'rootplate-fair-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('ExportPool: shops take turns', () => {
  it('a job of a second shop runs before the third and fourth of a shop that queued four first', async () => {
    // Answers with the job's tag, on its next turn of the event loop.
    const file = join(dir, 'echo.mjs')
    writeFileSync(file, `import { parentPort } from 'node:worker_threads'\nparentPort.on('message', ({ id, job }) => setTimeout(() => parentPort.postMessage({ id, ok: true, body: job.revision.designName }), 5))\n`)
    const pool = new ExportPool(file, 1)
    try {
      const done: string[] = []
      const run = (tag: string, shop: string) => pool.run(job(tag), shop).then((body) => { done.push(String(body)) })
      const all = [run('a1', 'A'), run('a2', 'A'), run('a3', 'A'), run('a4', 'A'), run('b1', 'B')]
      // One worker: a1 starts at once; the rest wait, by shop.
      expect(pool.waiting).toBe(4)
      expect(pool.waitingFor('A')).toBe(3)
      expect(pool.groupsWaiting).toBe(2)
      await Promise.all(all)
      // First in, first out would give a1 a2 a3 a4 b1; taking turns lets b1 in after a2.
      expect(done).toEqual(['a1', 'a2', 'b1', 'a3', 'a4'])
    }
    finally {
      await pool.close()
    }
  })
})

describe('ExportRunner: a full queue still admits a shop under its share', () => {
  it('one shop fills the queue; another shop gets in up to half of it; a third job of the first shop is refused', async () => {
    // A stand-in worker that never answers: every job stays in the making or waiting.
    const file = join(dir, 'silent.mjs')
    writeFileSync(file, `import { parentPort } from 'node:worker_threads'\nparentPort.on('message', () => {})\n`)
    const pool = new ExportPool(file, 1)
    const runner = new ExportRunner({ pool, buildStamp: 'b', queueMax: 4 })
    try {
      const pending: Promise<unknown>[] = []
      const keep = (p: Promise<unknown>) => { pending.push(p.catch(() => {})) }
      // Five members of shop A (one job each): one in the making, four waiting: the queue is full.
      for (let i = 0; i < 5; i++) keep(runner.run(job(`a${i}`), { key: `member:a${i}`, shop: 'A' }))
      expect(pool.waiting).toBe(4)
      await expect(runner.run(job('a5'), { key: 'member:a5', shop: 'A' })).rejects.toBeInstanceOf(ExportsQueueFullError)
      // Shop B holds nothing: its share with two shops waiting is 4 / 2 = 2 jobs.
      keep(runner.run(job('b0'), { key: 'member:b0', shop: 'B' }))
      keep(runner.run(job('b1'), { key: 'member:b1', shop: 'B' }))
      expect(pool.waitingFor('B')).toBe(2)
      await expect(runner.run(job('b2'), { key: 'member:b2', shop: 'B' })).rejects.toBeInstanceOf(ExportsQueueFullError)
    }
    finally {
      await pool.close()
    }
  })
})
