// The build sheet route against the built server, read back with independent
// readers: page sizes with pdf-lib, words with poppler's pdftotext, a page
// rendered with pdftoppm to look at. The design is this test's own.
import { execFileSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import { PDFDocument } from 'pdf-lib'
import { beforeAll, describe, expect, it, inject } from 'vitest'
import { api, demo, freshAddress, signIn } from './support/api'

const IN = 25.4 // exact (international yard and pound agreement 1959)
const shots = 'test-results/e2e'
let designer = ''
let builder = ''
let revisionId = ''
let unratedId = ''
/** NIST SP 811 (2008), Appendix B: 1 lb = 0.45359237 kg exactly; 1 lbf = 0.45359237 kg x 9.80665 m/s2. */
const KG_PER_LB = 0.45359237
const N_PER_LBF = 4.4482216152605

async function download(path: string, cookie?: string) {
  const headers: Record<string, string> = { 'x-forwarded-for': freshAddress() }
  if (cookie) headers.cookie = cookie
  const res = await fetch(`${inject('baseUrl')}${path}`, { headers, redirect: 'manual' })
  return { status: res.status, type: res.headers.get('content-type') ?? '', disposition: res.headers.get('content-disposition') ?? '', bytes: new Uint8Array(await res.arrayBuffer()) }
}

/** Words of a PDF as poppler reads them, spaces and line breaks collapsed. */
function pdfText(bytes: Uint8Array, name: string): string {
  const file = `${shots}/${name}.pdf`
  writeFileSync(file, bytes)
  return execFileSync('/usr/bin/pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ')
}

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  designer = await signIn(demo.designer)
  builder = await signIn(demo.builder)
  // Four kingpins on a 12 in radius with a 1.5 in swivel lead, a heavy load with its centre of mass at 36 in:
  // the worked value in REFERENCES ("Rolling stability") is 10.98 deg when the load dominates.
  const created = await api('/api/designs', {
    method: 'POST',
    cookie: designer,
    body: {
      name: 'Build sheet check stump',
      params: {
        tubeDiameter: 700, casterCount: 4, casterOffset: 12 * IN, pocketDiameter: 100,
        caster: { swivelLead: 1.5 * IN }, lobes: { irregularity: 0 },
        unit: { load: { weight: 5000, height: 36 * IN }, hardwarePerCaster: 0, casterRating: 500, counterweight: { count: 2 } },
      },
    },
  })
  expect(created.status).toBe(201)
  revisionId = created.body.revision.id
  // The same stump with no caster rating typed (the rating has no default: CONTRACTS third round).
  const unrated = await api('/api/designs', {
    method: 'POST',
    cookie: designer,
    body: {
      name: 'Build sheet unrated stump',
      params: { tubeDiameter: 700, casterCount: 4, casterOffset: 12 * IN, pocketDiameter: 150, caster: { swivelLead: 1.5 * IN }, lobes: { irregularity: 0 }, unit: { load: { weight: 300, height: 36 * IN } } },
    },
  })
  expect(unrated.status).toBe(201)
  unratedId = unrated.body.revision.id
})

describe('GET /api/revisions/:id/build-sheet.pdf', () => {
  it('keeps the unit saved with the revision', async () => {
    const r = await api(`/api/revisions/${revisionId}`, { cookie: builder })
    expect(r.status).toBe(200)
    expect(r.body.params.unit.load.weight).toBe(5000)
    expect(r.body.params.unit.counterweight).toMatchObject({ material: 'steel', count: 2 })
  })

  it('in inches: Letter pages (612 x 792 pt, ASME Y14.1) with the drawing, lists, steps, figures and cautions', async () => {
    const res = await download(`/api/revisions/${revisionId}/build-sheet.pdf?units=in`, builder)
    expect(res.status).toBe(200)
    expect(res.type).toContain('application/pdf')
    expect(res.disposition).toMatch(/filename="build-sheet-check-stump-r1-build-sheet\.pdf"/)
    const doc = await PDFDocument.load(res.bytes)
    // Two pages, or more where the lists run on (never cut off at the foot).
    expect(doc.getPageCount()).toBeGreaterThanOrEqual(2)
    for (const page of doc.getPages()) {
      expect(page.getWidth()).toBeCloseTo(612, 1)
      expect(page.getHeight()).toBeCloseTo(792, 1)
    }
    const text = pdfText(res.bytes, 'build-sheet-in')
    for (const words of ['Build sheet', 'Build sheet check stump', 'Revision r1', 'drawn by Priya Okafor', 'Main dimensions', 'Cut list', 'Layer 1 (top)', 'Layer 2 (bottom)', 'Hardware', 'Swivel casters', 'Pan fasteners', 'Counterweight blocks', 'Build steps', 'Laminate', 'square to its radial line', 'Caster orientation', 'tipping line', 'Shop math (estimates)', 'Leaves its wheels at', 'Overturns at', 'a root touches at', 'Raked stage, stops', 'Load per caster (worst)', 'any three of 4 wheels', 'even share', 'Cautions', 'qualified person', 'local codes', 'IEC 62368-1']) {
      expect(text).toContain(words)
    }
    // The last caution is on the page: pdftotext drops what runs off the bottom of a page.
    expect(text).toContain('take the blocks out before the unit is tipped, carried or stored')
    expect(text).toMatch(/Scale 1:\d+ \([\d/-]+ in = 1 ft\)/)
    // Plywood as the shop buys it: PS 1-19 category 23/32 is the retail "3/4 in" panel; two layers 46/32 = 1-7/16 in.
    expect(text).toContain('23/32 in plywood (sold as 3/4 in)')
    expect(text).toContain('1-7/16 in thick in all')
    // Pockets before the rabbets a bearing bit follows.
    expect(text.indexOf('Cut the pockets')).toBeLessThan(text.indexOf('Route each rabbet'))
    // 10.98 deg (REFERENCES worked value) to the sheet's one decimal.
    expect(text).toMatch(/Leaves its wheels at \(worst direction\) 11\.0°/)
    // Steel 2 x 4 x 4 in blocks: about 9.1 lb each (REFERENCES: EN 1991-1-1 Table A.4, computed).
    expect(text).toContain('9.1 lb each')
    // Four kingpins on a square round the load: the worst caster over any three-wheel stance carries W/2
    // (REFERENCES "Rolling stability"); the two blocks off centre move it by well under 1 %.
    const total = Number(/Total weight ([\d.]+) lb/.exec(text)![1])
    const worst = Number(/Load per caster \(worst\) ([\d.]+) lb/.exec(text)![1])
    expect(Math.abs(worst / total - 0.5)).toBeLessThan(0.01)
    // Over a 500 kg rating: a problem on the sheet, and a plate error the revision was saved with, so the
    // first page's saved-with-errors box names it (beside this stump's own pocket and opening errors).
    expect(text).toMatch(/Problem: The worst-loaded caster may carry/)
    const header = text.slice(0, text.indexOf('Scale 1:'))
    expect(header).toMatch(/SAVED WITH ERRORS \(\d+\)/)
    expect(header).toMatch(/worst-loaded caster may carry [\d.]+ lb when the plate stands on three of its wheels/)
    expect(text).toContain('rated 1102.3 lb each (maker\'s figure)')
  })

  it('in millimetres: A4 pages (595.28 x 841.89 pt, ISO 216), sizes in mm and kg', async () => {
    const res = await download(`/api/revisions/${revisionId}/build-sheet.pdf?units=mm`, builder)
    expect(res.status).toBe(200)
    const doc = await PDFDocument.load(res.bytes)
    // Two pages, or more where the lists run on (never cut off at the foot).
    expect(doc.getPageCount()).toBeGreaterThanOrEqual(2)
    expect(doc.getPage(0).getWidth()).toBeCloseTo(595.28, 1)
    expect(doc.getPage(0).getHeight()).toBeCloseTo(841.89, 1)
    const text = pdfText(res.bytes, 'build-sheet-mm')
    expect(text).toMatch(/Scale 1:\d+ /)
    expect(text).toContain('sizes in millimetres')
    // 12 in caster offset is 304.8 mm: 305 mm on the sheet.
    expect(text).toContain('305 mm, 4 casters')
    expect(text).toContain('4.1 kg each')
    // pdftoppm renders page 1 for a person to look at.
    execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '60', '-f', '1', '-l', '1', '-singlefile', `${shots}/build-sheet-mm.pdf`, `${shots}/build-sheet-mm-1`])
  })

  it('US units (NIST SP 811): the inch sheet\'s pounds and pound-force are the millimetre sheet\'s kilograms and newtons', async () => {
    const inch = pdfText((await download(`/api/revisions/${revisionId}/build-sheet.pdf?units=in`, builder)).bytes, 'build-sheet-us-in')
    const metric = pdfText((await download(`/api/revisions/${revisionId}/build-sheet.pdf?units=mm`, builder)).bytes, 'build-sheet-us-mm')
    const lb = Number(/Total weight ([\d.]+) lb/.exec(inch)![1])
    const kg = Number(/Total weight ([\d.]+) kg/.exec(metric)![1])
    expect(Math.abs(lb * KG_PER_LB - kg)).toBeLessThan(0.1)
    const lbf = Number(/Push that lifts its wheels ([\d.]+) lbf/.exec(inch)![1])
    const newtons = Number(/Push that lifts its wheels ([\d.]+) N/.exec(metric)![1])
    // Rounded to 0.1 lbf and 1 N; a push in "lbf" without gravity would differ by a factor of 9.8.
    expect(Math.abs(lbf * N_PER_LBF - newtons)).toBeLessThan(1)
  })

  it('with no caster rating typed, the sheet leaves a blank to fill in and raises no overload', async () => {
    const res = await download(`/api/revisions/${unratedId}/build-sheet.pdf?units=in`, builder)
    expect(res.status).toBe(200)
    const text = pdfText(res.bytes, 'build-sheet-unrated')
    expect(text).toContain('________ lb each (fill in the maker\'s rating)')
    expect(text).toContain('rating ________ (fill in)')
    expect(text).not.toContain('worst-loaded caster may carry')
    expect(text).not.toContain('SAVED WITH ERRORS')
    execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '60', '-f', '2', '-l', '2', '-singlefile', `${shots}/build-sheet-unrated.pdf`, `${shots}/build-sheet-unrated-2`])
  })

  it('answers 422 with a field message for unknown units, 401 without a session, 404 for no such revision', async () => {
    const bad = await api(`/api/revisions/${revisionId}/build-sheet.pdf?units=ft`, { cookie: builder })
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields.units).toMatch(/in or mm/)
    expect((await download(`/api/revisions/${revisionId}/build-sheet.pdf`)).status).toBe(401)
    expect((await download('/api/revisions/00000000-0000-4000-8000-000000000000/build-sheet.pdf', builder)).status).toBe(404)
  })
})
