// POST /api/sheet-plans and its files against the built server: roles and
// shops, validation, a plate too big for the sheet, the figures against hand
// arithmetic (REFERENCES.md), the layouts checked with polygon-clipping, the
// PDF read back with pdf-lib and pdftotext, a sheet's DXF with dxf-parser.
import { execFileSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import { beforeAll, describe, expect, it, inject } from 'vitest'
import { PDFDocument } from 'pdf-lib'
import DxfParser from 'dxf-parser'
import polygonClipping from 'polygon-clipping'
import { buildPlate, deriveForTube, plateParamsSchema, presetParams } from '../../geometry'
import { api, demo, signIn } from './support/api'
import { PLAN_SIZES, planShop } from './support/plan'
import { overlapArea, shoelace, type Pt } from '../unit/nest/checks'

const IN = 25.4
const SHEET = { width: 48 * IN, height: 96 * IN, thickness: 0.703 * IN, margin: 0.5 * IN, kerf: 0.25 * IN }
const shots = 'test-results/e2e'
let shop: Awaited<ReturnType<typeof planShop>>

const body = (counts: number[], extra: Record<string, unknown> = {}) => ({
  items: shop.designIds.map((designId, i) => ({ designId, count: counts[i]! })).filter((i) => i.count > 0),
  sheet: SHEET,
  workflow: 'panels',
  ...extra,
})

async function postFile(path: string, cookie: string, payload: unknown): Promise<{ status: number; bytes: Uint8Array; type: string | null; disposition: string | null }> {
  const res = await fetch(`${inject('baseUrl')}${path}`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify(payload) })
  return { status: res.status, bytes: new Uint8Array(await res.arrayBuffer()), type: res.headers.get('content-type'), disposition: res.headers.get('content-disposition') }
}

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  shop = await planShop('Quarry Road Players (sheet plan)')
})

describe('sheet plan route', () => {
  it('answers 401 without a session and 404 for designs of another shop, for every role', async () => {
    expect((await api('/api/sheet-plans', { method: 'POST', body: body([1, 0, 0]) })).status).toBe(401)
    for (const role of ['lead', 'designer', 'builder', 'viewer'] as const) {
      const cookie = await signIn(demo[role])
      const res = await api('/api/sheet-plans', { method: 'POST', cookie, body: body([1, 1, 0]) })
      expect(res.status, role).toBe(404)
    }
    const other = inject('other')
    const res = await api('/api/sheet-plans', { method: 'POST', cookie: shop.cookie, body: { ...body([1, 0, 0]), items: [{ designId: other.designId, count: 1 }] } })
    expect(res.status).toBe(404)
  })

  it('refuses bad input with field messages and keeps going', async () => {
    const cases: [unknown, string][] = [
      [{ ...body([1, 0, 0]), items: [] }, 'items'],
      [{ ...body([1, 0, 0]), items: [{ designId: shop.designIds[0], count: -1 }] }, 'items.0.count'],
      [{ ...body([1, 0, 0]), items: [{ designId: shop.designIds[0], count: 31 }] }, 'items.0.count'],
      [{ ...body([1, 0, 0]), items: [{ designId: 'nope', count: 1 }] }, 'items.0.designId'],
      [{ ...body([1, 0, 0]), workflow: 'glue-gun' }, 'workflow'],
      [{ ...body([1, 0, 0]), sheet: { ...SHEET, kerf: -1 } }, 'sheet.kerf'],
      [{ ...body([1, 0, 0]), sheet: { ...SHEET, width: 'wide' } }, 'sheet.width'],
      [{ ...body([1, 0, 0]), sheet: { ...SHEET, margin: 6 * IN, width: 12 * IN } }, 'sheet.margin'],
      [{ ...body([1, 0, 0]), items: [{ designId: shop.designIds[0], count: 1 }, { designId: shop.designIds[0], count: 1 }] }, 'items'],
    ]
    for (const [payload, field] of cases) {
      const res = await api('/api/sheet-plans', { method: 'POST', cookie: shop.cookie, body: payload })
      expect(res.status, field).toBe(422)
      expect(Object.keys(res.body.data.fields), field).toContain(field)
    }
    expect((await api('/api/sheet-plans', { method: 'POST', cookie: shop.cookie, body: body([1, 0, 0]) })).status).toBe(200)
  })

  it('refuses a plate larger than the sheet, naming the design', async () => {
    const res = await api('/api/sheet-plans', { method: 'POST', cookie: shop.cookie, body: body([0, 0, 1], { sheet: { ...SHEET, width: 14 * IN, height: 14 * IN } }) })
    expect(res.status).toBe(422)
    expect(res.body.data.fields['items.0.designId']).toMatch(/Boulder \(large\) is .* larger than the .* inside the sheet's edge margin/)
  })

  it('plans 2 + 2 + 2 glued first: whole-sheet glue lines, sheets = panels x layers, never below the area bound, parts apart', async () => {
    const res = await api('/api/sheet-plans', { method: 'POST', cookie: shop.cookie, body: body([2, 2, 2]) })
    expect(res.status).toBe(200)
    const plan = res.body
    expect(plan.figures.plates).toBe(6)
    // The starting shapes have two layers (PRODUCT.md: two glued layers of 3/4 in plywood).
    expect(plan.entries.map((e: any) => e.layers)).toEqual([2, 2, 2])
    expect(plan.figures.sheetsToBuy).toBe(plan.figures.panels * 2)
    // Area bound (REFERENCES.md): ceil(part area / usable area) panels, each two sheets.
    const usable = (SHEET.width - 2 * SHEET.margin) * (SHEET.height - 2 * SHEET.margin)
    const partArea = plan.layouts.flatMap((l: any) => l.parts).reduce((s: number, p: any) => s + Math.abs(shoelace(p.outline as Pt[])), 0)
    expect(plan.figures.panels).toBeGreaterThanOrEqual(Math.ceil(partArea / usable))
    // Glue: one line per panel of two sheets, over the whole 48 x 96 in sheet, a 6 mil film.
    const sheetArea = 48 * 96 * IN * IN
    expect(plan.figures.glue.area).toBeCloseTo(plan.figures.panels * sheetArea, 0)
    // Coverage (REFERENCES.md): 231 in3 per US gallon / 0.006 in = 38,500 in2, about 267 ft2 per gallon.
    // By hand, not from the plan's own area: panels x 48 x 96 in2 x 0.006 in / 231 in3 per US gallon (NIST Handbook 44, Appendix C).
    const sqIn = plan.figures.panels * 48 * 96
    expect(plan.figures.glue.usGallons).toBeCloseTo((sqIn * 0.006) / 231, 6)
    expect(plan.figures.glue.litres).toBeCloseTo(plan.figures.glue.usGallons * 3.785411784, 6)
    // Every part on the sheets, none overlapping another (polygon-clipping).
    for (const l of plan.layouts) {
      for (let i = 0; i < l.parts.length; i++) {
        for (let j = i + 1; j < l.parts.length; j++) expect(overlapArea(l.parts[i].outline, l.parts[j].outline)).toBe(0)
      }
    }
    expect(plan.layouts.flatMap((l: any) => l.parts).map((p: any) => p.layer)).toEqual(Array(6).fill('all'))
  })

  it('cut first: every layer is a part, glue only on the plates\' faces', async () => {
    const res = await api('/api/sheet-plans', { method: 'POST', cookie: shop.cookie, body: body([2, 2, 2], { workflow: 'layers' }) })
    expect(res.status).toBe(200)
    const plan = res.body
    const parts = plan.layouts.flatMap((l: any) => l.parts)
    expect(parts).toHaveLength(12)
    expect(parts.filter((p: any) => p.layer === 'top')).toHaveLength(6)
    expect(parts.filter((p: any) => p.layer === 'bottom')).toHaveLength(6)
    expect(plan.figures.panels).toBe(0)
    expect(plan.figures.sheetsToBuy).toBe(plan.layouts.length)
    // One glue line per two-layer plate, over its net area (outline less the through-holes).
    // Each plate's face by polygon-clipping, not the route's own areas: the outline less its through-holes (each a
    // 720-gon, its shortfall from pi r^2 added back), on the plates rebuilt from the params the designs were made with.
    const ring = (x: number, y: number, r: number): Pt[] => Array.from({ length: 720 }, (_, k) => [x + r * Math.cos((k * Math.PI) / 360), y + r * Math.sin((k * Math.PI) / 360)] as Pt)
    const faces = PLAN_SIZES.map((size) => {
      const plate = buildPlate(plateParamsSchema.parse(deriveForTube(presetParams('river-stone')!, size.tube * IN)))
      const clipped = polygonClipping.difference([plate.outline as Pt[]], ...plate.holes.map((h) => [ring(h.x, h.y, h.diameter / 2)]))
      const area = clipped.reduce((sum, poly) => sum + poly.reduce((a, r, k) => a + (k === 0 ? 1 : -1) * Math.abs(shoelace(r.slice(0, -1) as Pt[])), 0), 0)
      return area + plate.holes.reduce((sum, h) => sum + Math.PI * (h.diameter / 2) ** 2 * (1 - Math.sin(Math.PI / 360) / (Math.PI / 360)), 0)
    })
    expect(plan.entries.map((e: any) => e.layers)).toEqual([2, 2, 2])
    // Two of each size, one glue line each (two layers).
    const expected = faces.reduce((s, a) => s + 2 * a, 0)
    // Within 0.01 % (the two area readings differ by a few mm2 in 570 000; one pocket is over 8 000 mm2).
    expect(Math.abs(plan.figures.glue.area - expected)).toBeLessThan(expected * 1e-4)
  })

  it('writes the layouts PDF (a page per panel, parts labelled) and a DXF per panel on the cut file layers', async () => {
    const plan = (await api('/api/sheet-plans', { method: 'POST', cookie: shop.cookie, body: body([2, 2, 2]) })).body
    const pdf = await postFile('/api/sheet-plans/layouts.pdf', shop.cookie, { ...body([2, 2, 2]), units: 'in' })
    expect(pdf.status).toBe(200)
    expect(pdf.type).toContain('application/pdf')
    const doc = await PDFDocument.load(pdf.bytes)
    expect(doc.getPageCount()).toBe(plan.layouts.length)
    writeFileSync(`${shots}/sheet-plan.pdf`, pdf.bytes)
    const text = execFileSync('/usr/bin/pdftotext', ['-layout', `${shots}/sheet-plan.pdf`, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ')
    expect(text).toContain('Boulder (small), 2 layers glued')
    expect(text).toContain('Boulder (large), 2 layers glued')
    expect(text).toContain(`1 of ${plan.layouts.length}`)
    execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '60', '-f', '1', '-l', '1', '-singlefile', `${shots}/sheet-plan.pdf`, `${shots}/sheet-plan-1`])

    const dxf = await postFile('/api/sheet-plans/sheet.dxf', shop.cookie, { ...body([2, 2, 2]), units: 'in', index: 0 })
    expect(dxf.status).toBe(200)
    expect(dxf.disposition).toContain('sheet-plan-panels-1.dxf')
    const parsed = new DxfParser().parseSync(new TextDecoder().decode(dxf.bytes))!
    // $INSUNITS 1 = inches (DXF Reference, HEADER section).
    expect(parsed.header.$INSUNITS).toBe(1)
    const outside = parsed.entities.filter((e: any) => e.layer === 'RP-OUTSIDE-CUT')
    expect(outside).toHaveLength(plan.layouts[0].parts.length)
    for (const e of outside as any[]) {
      expect(e.shape).toBe(true)
      for (const v of e.vertices) {
        expect(v.x).toBeGreaterThanOrEqual(0.5 - 1e-6)
        expect(v.x).toBeLessThanOrEqual(47.5 + 1e-6)
        expect(v.y).toBeGreaterThanOrEqual(0.5 - 1e-6)
        expect(v.y).toBeLessThanOrEqual(95.5 + 1e-6)
      }
    }
    // Glued first, the panel is cut with the top layer's rabbets; the pockets and holes are there too.
    expect(Object.keys(parsed.tables.layer.layers).some((n) => n.startsWith('RP-RABBET-'))).toBe(true)
    expect(parsed.entities.some((e: any) => e.type === 'CIRCLE' && e.layer === 'RP-DRILL')).toBe(true)
    // Every pocket and access opening of every placed plate, routed (the default): each part's outline
    // holds as many inside-cut circles as its own design's cut file has (read back from the revision's file).
    const inside = parsed.entities.filter((e: any) => e.type === 'CIRCLE' && e.layer === 'RP-INSIDE-CUT') as any[]
    const inRing = (ring: Pt[], x: number, y: number) => {
      let isIn = false
      for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
        const [xi, yi] = ring[i]!
        const [xj, yj] = ring[j]!
        if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) isIn = !isIn
      }
      return isIn
    }
    let expectedInside = 0
    for (const part of plan.layouts[0].parts) {
      const entry = plan.entries[part.entry]
      const design = (await api(`/api/designs/${entry.designId}`, { cookie: shop.cookie })).body
      const own = new DxfParser().parseSync(await (await fetch(`${inject('baseUrl')}/api/revisions/${design.latest.id}/cut.dxf?units=in`, { headers: { cookie: shop.cookie } })).text())!
      const count = own.entities.filter((e: any) => e.type === 'CIRCLE' && e.layer === 'RP-INSIDE-CUT').length
      expect(count).toBeGreaterThan(0)
      const ring = (part.outline as Pt[]).map(([x, y]) => [x / IN, y / IN] as Pt)
      expect(inside.filter((c) => inRing(ring, c.center.x, c.center.y))).toHaveLength(count)
      expectedInside += count
    }
    expect(inside).toHaveLength(expectedInside)
    // The notes layer says what each part is and names the saw sizes.
    const notes = parsed.entities.filter((e: any) => e.layer === 'RP-NOTES' && e.type === 'TEXT').map((e: any) => e.text).join('\n')
    expect(notes).toContain('Part 1: ')
    expect(notes).toMatch(/Hole saws: /)
    // For a hand shop: the same holes as hole-saw marks, a layer per saw, never cut.
    const sawn = await postFile('/api/sheet-plans/sheet.dxf', shop.cookie, { ...body([2, 2, 2]), units: 'in', index: 0, openings: 'hole-saw' })
    const sawParsed = new DxfParser().parseSync(new TextDecoder().decode(sawn.bytes))!
    expect(sawParsed.entities.filter((e: any) => e.type === 'CIRCLE' && e.layer.startsWith('RP-HOLESAW-')).length).toBeGreaterThan(0)
    const bad = await postFile('/api/sheet-plans/sheet.dxf', shop.cookie, { ...body([2, 2, 2]), units: 'in', index: 0, openings: 'laser' })
    expect(bad.status).toBe(422)
    const beyond = await postFile('/api/sheet-plans/sheet.dxf', shop.cookie, { ...body([2, 2, 2]), units: 'in', index: plan.layouts.length })
    expect(beyond.status).toBe(422)
  })
})
