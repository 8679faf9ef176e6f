// The exporters on plates from the geometry core (buildPlate), not hand-built
// fixtures. Each file is read back by an independent reader (dxf-parser,
// happy-dom's XML parser, pdf-lib) and compared with the plate it was written
// from, measured by independent means: a polygon engine (polygon-clipping),
// the cubic Bezier formula, the presets' own typed numbers, and the tiling
// arithmetic done by hand with the paper sizes of ISO 216.
import { execFileSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import DxfParser, { type ICircleEntity, type ILwpolylineEntity } from 'dxf-parser'
import { Window } from 'happy-dom'
import { PDFDocument } from 'pdf-lib'
import polygonClipping from 'polygon-clipping'
import { beforeAll, describe, expect, it } from 'vitest'
// Through the library's front door, as the server routes will call it (CONTRACTS.md names).
import {
  buildPlate,
  plateParamsSchema,
  PRESETS,
  renderCutDxf,
  renderCutSvg,
  renderTemplatePdf,
  tubeWrapLayout,
  tilePlate,
  LAYER_INSIDE,
  LAYER_OUTSIDE,
} from '../../../geometry/index'
import { loadTemplateFontNode } from '../../../geometry/export/fonts-node'
import { flattenPath } from '../../../geometry/export/polyline'
import type { Point } from '../../../geometry/types'
import { shoelace, distanceToPolygon } from './fixture'

const plates = PRESETS.map((p) => ({ id: p.id, input: p.input, plate: buildPlate(plateParamsSchema.parse(p.input)) }))
let font: Uint8Array
beforeAll(async () => {
  font = await loadTemplateFontNode()
})

function perimeter(poly: Point[]): number {
  return poly.reduce((s, p, i) => s + Math.hypot(poly[(i + 1) % poly.length]![0] - p[0], poly[(i + 1) % poly.length]![1] - p[1]), 0)
}

/** A circle as a 1024-gon (regular polygon area n R^2 sin(2 pi / n) / 2: 6e-6 short of pi R^2). */
function ring(x: number, y: number, r: number, n = 1024): [number, number][] {
  return Array.from({ length: n }, (_, i) => [x + r * Math.cos((2 * Math.PI * i) / n), y + r * Math.sin((2 * Math.PI * i) / n)] as [number, number])
}

/** Area of a polygon-clipping result by the shoelace formula: outer rings less their holes. */
function multiArea(mp: [number, number][][][]): number {
  let area = 0
  for (const polygon of mp) polygon.forEach((r, i) => { area += (i === 0 ? 1 : -1) * Math.abs(shoelace(r.slice(0, -1))) })
  return area
}

/**
 * Dense points on an SVG path of absolute M, L, C and Z commands, each cubic
 * sampled by the Bernstein form B(t) = (1-t)^3 P0 + 3(1-t)^2 t P1 + 3(1-t) t^2 P2 + t^3 P3.
 */
function samplePath(d: string, perCurve = 24): Point[] {
  const tokens = d.match(/[MLCZmlcz]|-?\d*\.?\d+(?:e[-+]?\d+)?/g) ?? []
  const out: Point[] = []
  let i = 0
  let cmd = ''
  let cur: Point = [0, 0]
  const n = () => Number(tokens[i++])
  while (i < tokens.length) {
    if (/[A-Za-z]/.test(tokens[i]!)) cmd = tokens[i++]!
    if (cmd === 'Z' || cmd === 'z') continue
    if (cmd === 'M' || cmd === 'L') {
      cur = [n(), n()]
      out.push(cur)
    }
    else if (cmd === 'C') {
      const p1: Point = [n(), n()]
      const p2: Point = [n(), n()]
      const p3: Point = [n(), n()]
      for (let k = 1; k <= perCurve; k++) {
        const t = k / perCurve
        const u = 1 - t
        const b = [u * u * u, 3 * u * u * t, 3 * u * t * t, t * t * t] as const
        out.push([b[0] * cur[0] + b[1] * p1[0] + b[2] * p2[0] + b[3] * p3[0], b[0] * cur[1] + b[1] * p1[1] + b[2] * p2[1] + b[3] * p3[1]])
      }
      cur = p3
    }
    else throw new Error(`path command ${cmd} not read by this test`)
  }
  return out
}

describe.each(plates)('$id', ({ input, plate }) => {
  it('DXF (read back by dxf-parser) keeps the outline within the chord tolerance, and its holes are whole, apart and inside (polygon-clipping)', () => {
    const dxf = new DxfParser().parseSync(renderCutDxf(plate, { units: 'mm' }))!
    const outline = dxf.entities.filter((e) => e.layer === LAYER_OUTSIDE) as ILwpolylineEntity[]
    expect(outline).toHaveLength(1)
    expect(outline[0]!.shape).toBe(true)
    const pts = outline[0]!.vertices.map((v) => [v.x, v.y] as Point)
    expect(Math.abs(shoelace(pts) - shoelace(plate.outline))).toBeLessThanOrEqual(perimeter(plate.outline) * 0.1)
    // Every through-hole comes back where the plate has it: pockets and openings as inside profiles
    // (a file for a CNC router routes even the hole-saw sizes), centre and index holes on the drill layer.
    const routed = dxf.entities.filter((e) => e.layer === LAYER_INSIDE) as ICircleEntity[]
    expect(routed).toHaveLength(plate.holes.filter((h) => h.method !== 'drill').length)
    const sawn = dxf.entities.filter((e) => e.layer.startsWith('RP-HOLESAW-')) as ICircleEntity[]
    expect(sawn).toHaveLength(0)
    const drilled = dxf.entities.filter((e) => e.layer === 'RP-DRILL' && e.type === 'CIRCLE') as ICircleEntity[]
    const found = (h: { x: number; y: number; diameter: number }, among: ICircleEntity[]) =>
      among.find((c) => Math.hypot(c.center.x - h.x, c.center.y - h.y) < 1e-3 && Math.abs(2 * c.radius - h.diameter) < 1e-3)
    const circles: ICircleEntity[] = []
    for (const h of plate.holes) {
      const c = found(h, h.method === 'drill' ? drilled : routed)
      expect(c, `${h.id} in the file`).toBeDefined()
      circles.push(c!)
    }
    // The net area of the file measured two ways must agree: the DXF outline less each circle
    // taken alone, and the boolean difference of the same shapes by polygon-clipping. They differ
    // when holes overlap each other or cross the edge, which a sound plate never has.
    const loose = Math.abs(shoelace(pts)) - circles.reduce((s, c) => s + Math.PI * c.radius ** 2, 0)
    const boolean = multiArea(polygonClipping.difference([pts.map(([x, y]) => [x, y] as [number, number])], ...circles.map((c) => [ring(c.center.x, c.center.y, c.radius)])))
    expect(Math.abs(boolean - loose) / loose).toBeLessThan(1e-4)
    // The core's own net area figure agrees with the independent engine.
    expect(Math.abs(boolean - plate.metrics.area) / plate.metrics.area).toBeLessThan(5e-3)
  })

  it('the outline path, sampled by the Bezier formula, lies within 0.1 mm of the outline polygon, and its flattening within 0.05 mm of the curve', () => {
    const curve = samplePath(plate.outlinePath)
    expect(curve.length).toBeGreaterThan(50)
    // The polygon is within 0.1 mm of the curve (CONTRACTS.md chord error), both ways.
    const every = (n: number) => (_: unknown, i: number) => i % n === 0
    // (24 samples a curve: the chords between them sag about 0.01 mm at most on these bends.)
    expect(Math.max(...plate.outline.filter(every(5)).map((p) => distanceToPolygon(p, curve)))).toBeLessThanOrEqual(0.1)
    expect(Math.max(...curve.filter(every(7)).map((p) => distanceToPolygon(p, plate.outline)))).toBeLessThanOrEqual(0.1)
    const flat = flattenPath(plate.outlinePath, 0.05)
    expect(flat).not.toBeNull()
    // Its vertices lie on the curve, so the measure is the other way: how far the curve strays from its chords.
    expect(Math.max(...flat!.filter(every(3)).map((p) => distanceToPolygon(p, curve)))).toBeLessThanOrEqual(0.02)
    expect(Math.max(...curve.filter(every(3)).map((p) => distanceToPolygon(p, flat!)))).toBeLessThanOrEqual(0.05 + 0.005)
  }, 30_000)

  it('SVG (read back by an XML parser) is drawn at real size in inches: the outline encloses the same area', () => {
    const svg = renderCutSvg(plate, { units: 'in' })
    const doc = new new Window().DOMParser().parseFromString(svg, 'image/svg+xml')
    const root = doc.querySelector('svg')!
    expect(root.getAttribute('width')).toMatch(/^[\d.]+in$/)
    const polygon = doc.querySelector(`g[id="${LAYER_OUTSIDE}"] polygon`)!
    const pts = polygon.getAttribute('points')!.trim().split(/\s+/).map((p) => p.split(',').map(Number) as Point)
    // 1 in = 25.4 mm (NIST SP 811), so an area in square inches is mm2 / 645.16.
    expect(Math.abs(shoelace(pts)) * 645.16 / Math.abs(shoelace(plate.outline))).toBeCloseTo(1, 3)
  })

  it('tube wrap: one turn of the typed tube diameter (pi d), the notches inside the strip', () => {
    const layout = tubeWrapLayout(plate)
    expect(layout.circumference).toBeCloseTo(Math.PI * input.tubeDiameter!, 6)
    for (const n of layout.notches) for (const [a, b] of n.spans) {
      expect(a).toBeGreaterThanOrEqual(0)
      expect(b).toBeLessThanOrEqual(layout.circumference + 1e-9)
    }
  })
})

describe('template of a real plate', () => {
  /**
   * Sheets printed by hand for portrait A4 (210 x 297 mm, ISO 216) with a 1/4 in
   * margin and a 1/2 in overlap: the drawing (the outline plus 4 mm of clear
   * space) needs n = ceil((extent - overlap) / (printable - overlap)) sheets
   * along each side, the grid is centred on it, and a sheet the outline does
   * not reach (by polygon-clipping) is left out.
   */
  /** Every cell of the A4 grid, by hand (same figures as the writer's documentation: margin 6.35, overlap 12.7, 4 mm clear). */
  function gridByHand(outline: Point[]): [number, number][][] {
    const margin = 6.35
    const overlap = 12.7
    const pad = 4
    const xs = outline.map((p) => p[0])
    const ys = outline.map((p) => p[1])
    const minX = Math.min(...xs) - pad
    const maxX = Math.max(...xs) + pad
    const minY = Math.min(...ys) - pad
    const maxY = Math.max(...ys) + pad
    const pw = 210 - 2 * margin
    const ph = 297 - 2 * margin
    const cols = Math.ceil((maxX - minX - overlap) / (pw - overlap))
    const rows = Math.ceil((maxY - minY - overlap) / (ph - overlap))
    const left = (minX + maxX) / 2 - (cols * (pw - overlap) + overlap) / 2
    const top = (minY + maxY) / 2 + (rows * (ph - overlap) + overlap) / 2
    const cells: [number, number][][] = []
    for (let r = 0; r < rows; r++) {
      for (let c = 0; c < cols; c++) {
        const x0 = left + c * (pw - overlap)
        const y1 = top - r * (ph - overlap)
        cells.push([[x0, y1 - ph], [x0 + pw, y1 - ph], [x0 + pw, y1], [x0, y1]])
      }
    }
    return cells
  }

  // What the printed set must be, checked with polygon-clipping rather than the tiler: every part of
  // the plate on some printed sheet, and no printed sheet whose share of the plate the others all carry
  // (a sheet holding only a sliver inside a neighbour's overlap is left out).
  it.each(plates.map(({ id, plate }) => ({ id, plate })))('$id: the printed sheets cover the plate and none is redundant', ({ plate }) => {
    const tiling = tilePlate(plate, { paper: 'a4', orientation: 'portrait' })
    const cells = gridByHand(plate.outline)
    expect(tiling.sheets).toHaveLength(cells.length)
    const shape = [plate.outline.map(([x, y]) => [x, y] as [number, number])]
    const printed = tiling.sheets.filter((s) => !s.empty).map((s) => [[s.window.minX, s.window.minY], [s.window.maxX, s.window.minY], [s.window.maxX, s.window.maxY], [s.window.minX, s.window.maxY]] as [number, number][])
    // The windows are the hand grid's cells.
    for (const s of tiling.sheets) {
      const cell = cells[s.row * tiling.cols + s.col]!
      expect(s.window.minX).toBeCloseTo(cell[0]![0], 6)
      expect(s.window.maxY).toBeCloseTo(cell[2]![1], 6)
    }
    const uncovered = multiArea(polygonClipping.difference(shape, ...printed.map((w) => [w])))
    expect(uncovered).toBeLessThan(1e-6)
    printed.forEach((w, i) => {
      const others = printed.filter((_, k) => k !== i).map((o) => [o])
      const own = multiArea(polygonClipping.difference(polygonClipping.intersection(shape, [w]), ...others))
      expect(own).toBeGreaterThan(0)
    })
  })

  it.each(plates.map(({ id, plate }) => ({ id, plate })))('$id: a cover and one page per sheet the plate reaches', async ({ plate }) => {
    const bytes = await renderTemplatePdf(plate, { paper: 'a4', orientation: 'portrait', font, units: 'mm' })
    const doc = await PDFDocument.load(bytes)
    // The pages' own labels (R<row>-C<col>, the largest such word on each page, by poppler's pdftotext -bbox),
    // matched to the hand grid's cells, not to the tiler's count: together they cover the plate, each carries a
    // share of it no other page does (polygon-clipping), and no label comes twice.
    const dir = mkdtempSync(join(tmpdir(), 'rp-pages-'))
    writeFileSync(join(dir, 't.pdf'), bytes)
    const html = execFileSync('pdftotext', ['-bbox', join(dir, 't.pdf'), '-']).toString('utf8')
    const pages = html.split('<page ').slice(1)
    expect(pages).toHaveLength(doc.getPageCount())
    const cells = gridByHand(plate.outline)
    const cols = cells.filter((c) => c[2]![1] === cells[0]![2]![1]).length
    const labels = pages.slice(1).map((page) => {
      const found = [...page.matchAll(/<word xMin="[\d.]+" yMin="([\d.]+)" xMax="[\d.]+" yMax="([\d.]+)">R(\d+)-C(\d+)<\/word>/g)]
        .map((m) => ({ size: Number(m[2]) - Number(m[1]), row: Number(m[3]), col: Number(m[4]) }))
        .sort((a, b) => b.size - a.size)
      expect(found.length).toBeGreaterThan(0)
      return found[0]!
    })
    expect(new Set(labels.map((l) => `${l.row}-${l.col}`)).size).toBe(labels.length)
    expect(labels.length).toBeGreaterThan(1)
    const shape = [plate.outline.map(([x, y]) => [x, y] as [number, number])]
    const windows = labels.map((l) => cells[(l.row - 1) * cols + (l.col - 1)]!)
    expect(multiArea(polygonClipping.difference(shape, ...windows.map((w) => [w])))).toBeLessThan(1e-6)
    windows.forEach((w, i) => {
      const others = windows.filter((_, k) => k !== i).map((o) => [o])
      expect(multiArea(polygonClipping.difference(polygonClipping.intersection(shape, [w]), ...others))).toBeGreaterThan(0)
    })
    // Every sheet is A4 portrait, 595.28 x 841.89 pt (ISO 216; 1 pt = 1/72 in).
    for (const page of doc.getPages().slice(1)) {
      expect(page.getWidth()).toBeCloseTo(595.28, 1)
      expect(page.getHeight()).toBeCloseTo(841.89, 1)
    }
  })
})
