// The export runner, cache and worker pool (server/services/export-*.ts),
// without HTTP: the cache by revision and query, the per-owner limit, joined
// identical jobs, and real jobs on a real worker bundled the way the build
// bundles it. Files are read back with dxf-parser; sizes are hand values.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import DxfParser from 'dxf-parser'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ByteLru, exportKey } from '../../../server/services/export-cache'
import type { ExportJob } from '../../../server/services/export-jobs'
import { ExportJobError, ExportPool } from '../../../server/services/export-pool'
import { ExportRunner, ExportsBusyError, ExportsQueueFullError, findWorkerFile } from '../../../server/services/export-runner'
import { bundleExportWorker } from '../../../scripts/export-worker-build'

const revision = { number: 3, params: { tubeDiameter: 304.8 }, designName: 'Runner test elm', sizeLabel: null, createdAt: new Date('2026-03-01T12:00:00Z') }
const dxfJob = (units: 'in' | 'mm'): Extract<ExportJob, { kind: 'cut-dxf' }> => ({ kind: 'cut-dxf', revision, query: { units, reference: true, mirror: false, layer: 'all', openings: 'routed' } })

/** A stand-in writer whose jobs finish only when the test says so. */
function heldWriter() {
  const waiting: Array<() => void> = []
  let calls = 0
  const write = (job: ExportJob) => {
    calls++
    return new Promise<string>(resolve => waiting.push(() => resolve(`file for ${JSON.stringify('query' in job ? job.query : job.kind)}`)))
  }
  return { write, release: () => waiting.splice(0).forEach(r => r()), calls: () => calls }
}

describe('ByteLru', () => {
  it('keeps at most its bytes, dropping the least recently used first', () => {
    const lru = new ByteLru(10)
    lru.set('a', new Uint8Array(4))
    lru.set('b', 'xxxx')
    lru.get('a') // a is now newer than b
    lru.set('c', new Uint8Array(4)) // 12 bytes > 10: b goes
    expect(lru.get('b')).toBeUndefined()
    expect(lru.get('a')?.length).toBe(4)
    expect(lru.bytes).toBe(8)
    // A string counts its UTF-8 bytes: 'é' is 2 bytes (RFC 3629).
    lru.set('d', 'éé')
    expect(lru.bytes).toBe(8)
    expect(lru.size).toBe(2)
    // A file larger than the whole cache is not kept, and pushes nothing out.
    lru.set('e', new Uint8Array(11))
    expect(lru.get('e')).toBeUndefined()
    expect(lru.size).toBe(2)
  })
})

describe('ExportRunner', () => {
  it('makes a file once and serves the identical second request from the cache', async () => {
    let builds = 0
    const runner = new ExportRunner({ pool: null, buildStamp: 'b1', inThread: async (job) => { builds++; return `dxf ${job.kind}` } })
    const first = await runner.run(dxfJob('in'), 'member:a')
    const second = await runner.run(dxfJob('in'), 'member:b')
    expect([first.cache, second.cache]).toEqual(['miss', 'hit'])
    expect(second.body).toBe(first.body)
    expect(builds).toBe(1)
    await runner.run(dxfJob('mm'), 'member:a')
    expect(builds).toBe(2)
    expect(runner.builds).toBe(2)
  })

  it('keys a file by build, kind, revision and query: a new build never finds an old file', () => {
    expect(exportKey(dxfJob('in'), 'build-1')).toBe(exportKey(dxfJob('in'), 'build-1'))
    expect(exportKey(dxfJob('in'), 'build-2')).not.toBe(exportKey(dxfJob('in'), 'build-1'))
    expect(exportKey(dxfJob('mm'), 'build-1')).not.toBe(exportKey(dxfJob('in'), 'build-1'))
    // A renamed design prints its new name: another file.
    expect(exportKey({ ...dxfJob('in'), revision: { ...revision, designName: 'Runner test oak' } }, 'build-1')).not.toBe(exportKey(dxfJob('in'), 'build-1'))
  })

  it('lets one owner have two files in the making; the third is refused until one ends; others are not held up', async () => {
    const held = heldWriter()
    const runner = new ExportRunner({ pool: null, buildStamp: 'b', inThread: held.write })
    const job = (overlap: number): ExportJob => ({ kind: 'template', revision, query: { paper: 'letter', orientation: 'auto', overlap, units: 'in', layer: 'all' }, font: new Uint8Array() })
    const a = runner.run(job(1), 'member:a')
    const b = runner.run(job(2), 'member:a')
    await expect(runner.run(job(3), 'member:a')).rejects.toBeInstanceOf(ExportsBusyError)
    const other = runner.run(job(3), 'member:b')
    held.release()
    await Promise.all([a, b, other])
    // Both slots are free again.
    const c = runner.run(job(4), 'member:a')
    held.release()
    expect((await c).cache).toBe('miss')
  })

  it('joins identical requests made at the same time to one build', async () => {
    const held = heldWriter()
    const runner = new ExportRunner({ pool: null, buildStamp: 'b', inThread: held.write })
    const replies = [runner.run(dxfJob('in'), 'member:a'), runner.run(dxfJob('in'), 'member:b'), runner.run(dxfJob('in'), 'share:c')]
    held.release()
    const bodies = (await Promise.all(replies)).map(r => r.body)
    expect(new Set(bodies).size).toBe(1)
    expect(held.calls()).toBe(1)
  })
})

describe('ExportPool with the bundled worker', () => {
  let dir = ''
  let pool: ExportPool

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'rootplate-worker-'))
    await bundleExportWorker(join(dir, 'export-worker.mjs'))
    pool = new ExportPool(join(dir, 'export-worker.mjs'), 2)
  }, 120_000)

  afterAll(async () => {
    await pool?.close()
    rmSync(dir, { recursive: true, force: true })
  })

  it('is found beside the server entry from a chunk folder below it', () => {
    expect(findWorkerFile(join(dir, 'chunks', 'routes', 'api'))).toBe(join(dir, 'export-worker.mjs'))
    expect(findWorkerFile(join(tmpdir(), 'no-such-place'), 1)).toBeNull()
  })

  it('writes cut files on worker threads: inches and millimetres ($INSUNITS 1 and 4, DXF Reference, HEADER)', async () => {
    const [inches, mm] = await Promise.all([pool.run(dxfJob('in')), pool.run(dxfJob('mm'))])
    const parser = new DxfParser()
    expect(parser.parseSync(inches as string)!.header.$INSUNITS).toBe(1)
    expect(parser.parseSync(mm as string)!.header.$INSUNITS).toBe(4)
  })

  it('carries a refusal back as data: the sheet cap on paper, and bad stored params', async () => {
    const huge = { ...revision, params: { tubeDiameter: 1244.6, casterCount: 8, casterOffset: 1500, lobes: { count: 24, reach: 900, width: 1200, valley: 300, irregularity: 0, roundness: 1 } } }
    const job: ExportJob = { kind: 'template', revision: huge, query: { paper: 'letter', orientation: 'auto', units: 'in', layer: 'all' }, font: new Uint8Array() }
    const err = await pool.run(job).catch((e: unknown) => e)
    expect(err).toBeInstanceOf(ExportJobError)
    const failure = (err as ExportJobError).failure
    expect(failure.statusCode).toBe(422)
    expect((failure.data as { fields: Record<string, string> }).fields.paper).toMatch(/roll/)
    const broken = await pool.run({ ...dxfJob('in'), revision: { ...revision, params: { tubeDiameter: 'wide' } } }).catch((e: unknown) => e)
    expect((broken as ExportJobError).failure.statusCode).toBe(422)
    // The pool still works after refusals.
    expect(typeof await pool.run(dxfJob('in'))).toBe('string')
  })
})

describe('ExportPool when a worker misbehaves', () => {
  let dir = ''
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'rootplate-bad-worker-'))
    // Stand-in workers: one never answers, one dies on its first job.
    writeFileSync(join(dir, 'silent.mjs'), `import { parentPort } from 'node:worker_threads'\nparentPort.on('message', () => {})\n`)
    writeFileSync(join(dir, 'dies.mjs'), `import { parentPort } from 'node:worker_threads'\nparentPort.on('message', () => process.exit(3))\n`)
  })
  afterAll(() => rmSync(dir, { recursive: true, force: true }))

  it('stops a job past its time limit with a 503, and the next job gets a fresh worker', async () => {
    const pool = new ExportPool(join(dir, 'silent.mjs'), 1, 300)
    const first = await pool.run(dxfJob('in')).catch((e: unknown) => e)
    expect(first).toBeInstanceOf(ExportJobError)
    expect((first as ExportJobError).failure.statusCode).toBe(503)
    const second = await pool.run(dxfJob('mm')).catch((e: unknown) => e)
    expect((second as ExportJobError).failure.statusCode).toBe(503)
    await pool.close()
  })

  it('fails only the job whose worker died', async () => {
    const pool = new ExportPool(join(dir, 'dies.mjs'), 1, 5_000)
    const err = await pool.run(dxfJob('in')).catch((e: unknown) => e)
    expect(String(err)).toMatch(/exited with code 3/)
    expect(pool.running).toBe(0)
    await pool.close()
  })

  it('turns new jobs away while the queue is full, but still joins a file already being made', async () => {
    const pool = new ExportPool(join(dir, 'silent.mjs'), 1, 60_000)
    const runner = new ExportRunner({ pool, buildStamp: 'b', queueMax: 1 })
    const busy = runner.run(dxfJob('in'), 'member:a').catch(() => undefined)
    const waiting = runner.run(dxfJob('mm'), 'member:b').catch(() => undefined)
    expect(pool.waiting).toBe(1)
    await expect(runner.run({ ...dxfJob('in'), query: { ...dxfJob('in').query, reference: false } }, 'member:c')).rejects.toBeInstanceOf(ExportsQueueFullError)
    // The same file as the one being made waits for it instead.
    const joined = runner.run(dxfJob('in'), 'member:d').catch((e: unknown) => e)
    await pool.close()
    await Promise.all([busy, waiting])
    expect(await joined).not.toBeInstanceOf(ExportsQueueFullError)
    expect(runner.builds).toBe(2)
  })
})
