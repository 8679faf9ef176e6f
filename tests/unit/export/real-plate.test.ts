// The exporters on plates from the geometry core (buildPlate), not hand-built fixtures.
import DxfParser, { type ICircleEntity, type ILwpolylineEntity } from 'dxf-parser'
import { PDFDocument } from 'pdf-lib'
import { beforeAll, describe, expect, it } from 'vitest'
// Through the library's front door, as the server routes will call it (CONTRACTS.md names).
import {
  buildPlate,
  plateParamsSchema,
  PRESETS,
  renderCutDxf,
  renderCutSvg,
  renderTemplatePdf,
  planTemplate,
  tubeWrapLayout,
  LAYER_INSIDE,
  LAYER_OUTSIDE,
} from '../../../geometry/index'
import { loadTemplateFontNode } from '../../../geometry/export/fonts-node'
import { flattenPath } from '../../../geometry/export/polyline'
import type { Point } from '../../../geometry/types'
import { shoelace, distanceToPolygon } from './fixture'

const plates = PRESETS.map((p) => ({ id: p.id, plate: buildPlate(plateParamsSchema.parse(p.input)) }))
let font: Uint8Array
beforeAll(async () => {
  font = await loadTemplateFontNode()
})

function perimeter(poly: Point[]): number {
  return poly.reduce((s, p, i) => s + Math.hypot(poly[(i + 1) % poly.length]![0] - p[0], poly[(i + 1) % poly.length]![1] - p[1]), 0)
}

describe.each(plates)('$id', ({ plate }) => {
  it('DXF (read back by dxf-parser) keeps the outline area within the chord tolerance and every round hole', () => {
    const dxf = new DxfParser().parseSync(renderCutDxf(plate, { units: 'mm' }))!
    const outline = dxf.entities.filter((e) => e.layer === LAYER_OUTSIDE) as ILwpolylineEntity[]
    expect(outline).toHaveLength(1)
    expect(outline[0]!.shape).toBe(true)
    const pts = outline[0]!.vertices.map((v) => [v.x, v.y] as Point)
    expect(Math.abs(shoelace(pts) - shoelace(plate.outline))).toBeLessThanOrEqual(perimeter(plate.outline) * 0.1)
    // Outline less through-holes is the core's own area figure (index holes are drilled, and counted too).
    // Routed openings are inside profiles; hole-sawn ones are drawn on a non-cut layer named with the
    // saw, with the saw's pilot point on the drill layer.
    const circles = dxf.entities.filter((e) => e.layer === LAYER_INSIDE) as ICircleEntity[]
    expect(circles).toHaveLength(plate.holes.filter((h) => h.method === 'routed').length)
    const sawn = dxf.entities.filter((e) => e.layer.startsWith('RP-HOLESAW-')) as ICircleEntity[]
    expect(sawn).toHaveLength(plate.holes.filter((h) => h.method === 'hole-saw').length)
    const holesArea = plate.holes.reduce((s, h) => s + (Math.PI * h.diameter ** 2) / 4, 0)
    expect(Math.abs(shoelace(pts) - holesArea - plate.metrics.area) / plate.metrics.area).toBeLessThan(5e-3)
  })

  it('reads the core outline path and flattens it close to the outline polygon', () => {
    const flat = flattenPath(plate.outlinePath, 0.05)
    expect(flat).not.toBeNull()
    // Both are within 0.1 mm of the same curve (the core's contract), so within 0.15 mm of each other.
    const worst = Math.max(...plate.outline.filter((_, i) => i % 7 === 0).map((p) => distanceToPolygon(p, flat!)))
    expect(worst).toBeLessThanOrEqual(0.15)
  })

  it('SVG carries the same layers', () => {
    const svg = renderCutSvg(plate, { units: 'in' })
    expect(svg).toContain(`<g id="${LAYER_OUTSIDE}"`)
    expect(svg).toMatch(/width="[\d.]+in"/)
  })

  it('tube wrap notches sit inside the strip', () => {
    const layout = tubeWrapLayout(plate)
    expect(layout.circumference).toBeCloseTo(Math.PI * plate.trunk.diameter, 9)
    for (const n of layout.notches) for (const [a, b] of n.spans) {
      expect(a).toBeGreaterThanOrEqual(0)
      expect(b).toBeLessThanOrEqual(layout.circumference + 1e-9)
    }
  })
})

describe('template of a real plate', () => {
  it('has a cover and one page per printed sheet of its tiling', async () => {
    const { plate } = plates[0]!
    const { tiling } = planTemplate(plate, { paper: 'a4' })
    const doc = await PDFDocument.load(await renderTemplatePdf(plate, { paper: 'a4', font, units: 'mm' }))
    expect(doc.getPageCount()).toBe(tiling.printed + 1)
  })
})
