// Costly exports (issue 17 item 3): a cap on sheets per template, finished
// files cached by revision and query, the work done on worker threads, and a
// limit on files in the making per member. The sheet cap (200) and the limit
// (2 per member) are our own choices; paper sizes are ASME Y14.1 and ISO 216
// (REFERENCES.md). Files are read back with pdf-lib and dxf-parser.
import DxfParser from 'dxf-parser'
import { PDFDocument } from 'pdf-lib'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { api, demo, signIn } from './support/api'

// Our own test shapes: the biggest tube and roots the params allow (about
// 3.9 m across), and a smaller one that still makes a file of 100+ sheets.
const HUGE = { tubeDiameter: 1244.6, casterCount: 8, casterOffset: 1500, lobes: { count: 24, reach: 900, width: 1200, valley: 300, irregularity: 0, roundness: 1 } }
const LARGE = { tubeDiameter: 1244.6, casterCount: 8, casterOffset: 1000, lobes: { count: 12, reach: 600, width: 600, valley: 100, irregularity: 0, roundness: 1 } }

let designer = ''
let builder = ''
let hugeRevision = ''
let largeRevision = ''
let smallRevision = ''

async function create(name: string, params: unknown): Promise<string> {
  const res = await api('/api/designs', { method: 'POST', cookie: designer, body: { name, params } })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.revision.id
}

function get(revisionId: string, file: string, query: string, cookie: string) {
  return fetch(`${inject('baseUrl')}/api/revisions/${revisionId}/${file}?${query}`, { headers: { cookie } })
}

beforeAll(async () => {
  designer = await signIn(demo.designer)
  builder = await signIn(demo.builder)
  hugeRevision = await create('Export cost giant sequoia', HUGE)
  largeRevision = await create('Export cost large baobab', LARGE)
  smallRevision = await create('Export cost stump', { tubeDiameter: 304.8 })
})

describe('sheet cap', () => {
  it('refuses a template of more than 200 Letter sheets with a 422 on paper, naming a larger paper and a roll', async () => {
    // 3.9 m of plate on 8.5 x 11 in sheets (ASME Y14.1 size A) less margins and overlaps: well over 200 sheets.
    const res = await api(`/api/revisions/${hugeRevision}/template.pdf?paper=letter`, { cookie: builder })
    expect(res.status).toBe(422)
    expect(res.body.data.fields.paper).toMatch(/at most|most one file holds is 200/)
    expect(res.body.data.fields.paper).toMatch(/roll/)
    expect(res.body.data.fields.paper).toMatch(/Tabloid|A3/)
    const sheets = Number(/on (\d+) Letter sheets/.exec(res.body.data.fields.paper)?.[1])
    // A lower bound by area alone: 3.9 m square over one sheet's printable 8 x 10.5 in.
    expect(sheets).toBeGreaterThan((3924 * 3924) / (8 * 25.4 * 10.5 * 25.4) * 0.5)
  })

  it('makes the same plate on a 36 in roll: a file of at most 200 pages, read back by pdf-lib', async () => {
    const res = await get(hugeRevision, 'template.pdf', 'paper=roll-36in', builder)
    expect(res.status, res.status === 200 ? '' : await res.clone().text()).toBe(200)
    const doc = await PDFDocument.load(new Uint8Array(await res.arrayBuffer()))
    expect(doc.getPageCount()).toBeGreaterThan(1)
    expect(doc.getPageCount()).toBeLessThanOrEqual(200)
    // 36 in = 2592 pt wide (1 pt = 1/72 in, ISO 32000-1).
    expect(doc.getPages().slice(1).some(p => Math.abs(Math.min(p.getWidth(), p.getHeight()) - 2592) < 1)).toBe(true)
  })
})

describe('cache', () => {
  it('serves the second identical template from the cache, byte for byte; another query is made anew', async () => {
    const first = await get(smallRevision, 'template.pdf', 'paper=a4&overlap=11', designer)
    expect(first.status).toBe(200)
    expect(first.headers.get('x-rootplate-cache')).toBe('miss')
    // The production build writes files on a worker thread, not on the server's event loop.
    expect(first.headers.get('x-rootplate-made-by')).toBe('worker')
    const a = new Uint8Array(await first.arrayBuffer())
    // Another member of the shop asks for the same file: revisions never change, so it is the same file.
    const second = await get(smallRevision, 'template.pdf', 'overlap=11&paper=a4', builder)
    expect(second.headers.get('x-rootplate-cache')).toBe('hit')
    const b = new Uint8Array(await second.arrayBuffer())
    expect(Buffer.compare(Buffer.from(a), Buffer.from(b))).toBe(0)
    expect(second.headers.get('content-disposition')).toBe(first.headers.get('content-disposition'))
    const other = await get(smallRevision, 'template.pdf', 'paper=a4&overlap=12', designer)
    expect(other.headers.get('x-rootplate-cache')).toBe('miss')
    await other.arrayBuffer()
  })

  it('caches the cut file per units: inches and millimetres are two files ($INSUNITS 1 and 4, DXF Reference)', async () => {
    const codes: number[] = []
    for (const [units, cache] of [['in', 'miss'], ['mm', 'miss'], ['in', 'hit'], ['mm', 'hit']] as const) {
      const res = await get(smallRevision, 'cut.dxf', `units=${units}`, designer)
      expect(res.headers.get('x-rootplate-cache'), units).toBe(cache)
      codes.push(new DxfParser().parseSync(await res.text())!.header.$INSUNITS as number)
    }
    expect(codes).toEqual([1, 4, 1, 4])
  })
})

describe('files in the making per member', () => {
  it('lets one member make two large files at once, answers a third with 429 and Retry-After, and leaves other members alone', async () => {
    // Four different queries (not cached, not joined), sent together by one member.
    const mine = [10, 11, 12, 13].map(o => get(largeRevision, 'template.pdf', `paper=letter&overlap=${o}`, designer))
    const theirs = get(largeRevision, 'template.pdf', 'paper=letter&overlap=14', builder)
    const replies = await Promise.all(mine)
    const statuses = replies.map(r => r.status)
    expect(statuses.filter(s => s === 200)).toHaveLength(2)
    expect(statuses.filter(s => s === 429)).toHaveLength(2)
    const refused = replies.find(r => r.status === 429)!
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    expect((await refused.json()).message).toMatch(/already have 2 files being made/)
    expect((await theirs).status).toBe(200)
    for (const r of replies) if (r !== refused) await r.arrayBuffer()
    // Once those are done the member may go on.
    const after = await get(largeRevision, 'template.pdf', 'paper=letter&overlap=13', designer)
    expect(after.status).toBe(200)
    const doc = await PDFDocument.load(new Uint8Array(await after.arrayBuffer()))
    expect(doc.getPageCount()).toBeGreaterThan(50)
  })
})
