// What the printed template shows, measured in its rendered pixels (issue 27:
// picture checks that only looked at a file's size). The cover's two scale
// squares are found through poppler's own text boxes (pdftotext -bbox, the
// captions "1 in square" and "25 mm square"), the page is rendered by poppler's
// pdftoppm at 200 dpi, and each square's sides are measured stroke centre to
// stroke centre. Hand values: 1 in = 25.4 mm exactly (NIST SP 811), so at
// 200 dpi 1 in = 200 px and 25 mm = 25 / 25.4 x 200 = 196.85 px; a tolerance
// of 1.5 px tells the two squares apart (3.15 px) and allows rasterising.
import { execFileSync } from 'node:child_process'
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { PNG } from 'pngjs'
import { beforeAll, describe, expect, it } from 'vitest'
import { api, demo, signIn } from './support/api'
import { download } from './support/files'

const shots = 'test-results/e2e'
const DPI = 200
const PX_PER_PT = DPI / 72
let cookie = ''
let revisionId = ''

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  cookie = await signIn(demo.designer)
  // A design of this file's own (every default), so no other test's change moves what is measured.
  const made = await api('/api/designs', { method: 'POST', cookie, body: { name: 'Picture check ash', params: {} } })
  expect(made.status).toBe(201)
  revisionId = made.body.revision.id
})

interface Word { text: string; xMin: number; yMin: number; xMax: number; yMax: number }

/** Words of one page with their boxes in points from the top left, as pdftotext -bbox gives them. */
function words(pdf: string, page: number): Word[] {
  const html = execFileSync('pdftotext', ['-bbox', '-f', String(page), '-l', String(page), pdf, '-']).toString('utf8')
  return [...html.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)]
    .map(m => ({ xMin: Number(m[1]), yMin: Number(m[2]), xMax: Number(m[3]), yMax: Number(m[4]), text: m[5]! }))
}

/** The box of a run of words on one line, e.g. ['1', 'in', 'square']. */
function phrase(list: Word[], parts: string[]): Word {
  for (let i = 0; i + parts.length <= list.length; i++) {
    const run = list.slice(i, i + parts.length)
    if (run.every((w, k) => w.text === parts[k]) && run.every(w => Math.abs(w.yMin - run[0]!.yMin) < 1)) {
      return { text: parts.join(' '), xMin: run[0]!.xMin, yMin: run[0]!.yMin, xMax: run.at(-1)!.xMax, yMax: run[0]!.yMax }
    }
  }
  throw new Error(`no "${parts.join(' ')}" on the page`)
}

function dark(png: PNG, x: number, y: number): boolean {
  const i = (Math.round(y) * png.width + Math.round(x)) * 4
  return png.data[i]! + png.data[i + 1]! + png.data[i + 2]! < 3 * 128
}

/** Centres of the dark runs met walking from (x, y) by (dx, dy), up to `limit` steps. */
function runs(png: PNG, x: number, y: number, dx: number, dy: number, limit: number): number[] {
  const out: number[] = []
  let start = -1
  for (let s = 0; s <= limit; s++) {
    const on = dark(png, x + dx * s, y + dy * s)
    if (on && start < 0) start = s
    if (!on && start >= 0) { out.push((start + s - 1) / 2); start = -1 }
  }
  return out
}

/** Width and height (px, stroke centre to centre) of the square whose caption is `caption`. */
function squareAbove(png: PNG, caption: Word): { width: number; height: number } {
  const cx = ((caption.xMin + caption.xMax) / 2) * PX_PER_PT
  const top = caption.yMin * PX_PER_PT - 2
  // Up a column a quarter inch left of centre (clear of the label inside): bottom side, then top side.
  const up = runs(png, cx - 18 * PX_PER_PT, top, 0, -1, 1.5 * DPI)
  expect(up.length, 'two horizontal sides above the caption').toBeGreaterThanOrEqual(2)
  const height = up[1]! - up[0]!
  // Across a row a quarter inch above the bottom side (below the label): left side, then right side.
  const rowY = top - up[0]! - 18 * PX_PER_PT
  const left = runs(png, cx, rowY, -1, 0, DPI)
  const right = runs(png, cx, rowY, 1, 0, DPI)
  expect(left.length && right.length, 'a vertical side either way').toBeTruthy()
  return { width: left[0]! + right[0]!, height }
}

describe('the template cover, rendered', () => {
  it.each(['letter', 'a4'] as const)('on %s, its 1 in square measures 200 px and its 25 mm square 196.85 px at 200 dpi', async (paper) => {
    const res = await download(`/api/revisions/${revisionId}/template.pdf?paper=${paper}&units=in`, cookie)
    expect(res.status).toBe(200)
    const pdf = `${shots}/picture-check-${paper}.pdf`
    writeFileSync(pdf, res.bytes)
    execFileSync('pdftoppm', ['-png', '-r', String(DPI), '-f', '1', '-l', '1', '-singlefile', pdf, `${shots}/picture-check-${paper}`])
    const png = PNG.sync.read(readFileSync(`${shots}/picture-check-${paper}.png`))
    const list = words(pdf, 1)
    const inch = squareAbove(png, phrase(list, ['1', 'in', 'square']))
    const mm25 = squareAbove(png, phrase(list, ['25', 'mm', 'square']))
    for (const side of [inch.width, inch.height]) expect(Math.abs(side - 200)).toBeLessThan(1.5)
    for (const side of [mm25.width, mm25.height]) expect(Math.abs(side - 25 / 25.4 * DPI)).toBeLessThan(1.5)
  })
})
