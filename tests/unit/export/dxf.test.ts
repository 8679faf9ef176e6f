// The cut file read back with an independent reader, dxf-parser 1.1.2.
import DxfParser, { type ICircleEntity, type IDxf, type IEntity, type ILwpolylineEntity } from 'dxf-parser'
import { describe, expect, it } from 'vitest'
import type { Plate, Point } from '../../../geometry/types'
import { renderCutDxf } from '../../../geometry/export/dxf'
import { LAYER_DRILL, LAYER_INSIDE, LAYER_OUTSIDE, LAYER_NOTES, LAYER_REFERENCE, rabbetLayerName } from '../../../geometry/export/cut-layers'
import { fixturePlate, shoelace, distanceToPolygon } from './fixture'

const IN = 25.4 // mm per inch, exact (NIST SP 811)

function parse(text: string): IDxf {
  return new DxfParser().parseSync(text)!
}

function onLayer<T extends IEntity>(dxf: IDxf, layer: string, type: string): T[] {
  return dxf.entities.filter((e) => e.layer === layer && e.type === type) as T[]
}

function outlineOf(dxf: IDxf): ILwpolylineEntity {
  const outlines = onLayer<ILwpolylineEntity>(dxf, LAYER_OUTSIDE, 'LWPOLYLINE')
  expect(outlines).toHaveLength(1)
  return outlines[0]!
}

function vertices(e: ILwpolylineEntity): Point[] {
  return e.vertices.map((v) => [v.x, v.y] as Point)
}

function perimeter(poly: Point[]): number {
  return poly.reduce((s, p, i) => {
    const q = poly[(i + 1) % poly.length]!
    return s + Math.hypot(q[0] - p[0], q[1] - p[1])
  }, 0)
}

const plate = fixturePlate()

describe('renderCutDxf header and units', () => {
  it('writes $INSUNITS 1 for inches and 4 for millimetres (DXF Reference, HEADER section)', () => {
    expect(parse(renderCutDxf(plate, { units: 'in' })).header.$INSUNITS).toBe(1)
    expect(parse(renderCutDxf(plate, { units: 'mm' })).header.$INSUNITS).toBe(4)
  })

  it('throws a clear error for an unknown unit', () => {
    expect(() => renderCutDxf(plate, { units: 'ft' as never })).toThrow(/Unknown units "ft"/)
    expect(() => renderCutDxf(plate, { units: 'mm', chordTolerance: 0 })).toThrow(/chordTolerance/)
  })
})

describe('renderCutDxf geometry', () => {
  it('writes the outline as one closed LWPOLYLINE (group 70 flag 1, read back as shape: true)', () => {
    const dxf = parse(renderCutDxf(plate, { units: 'mm' }))
    const outline = outlineOf(dxf)
    expect(outline.shape).toBe(true)
    expect(outline.vertices).toHaveLength(plate.outline.length)
  })

  it('keeps the outline area within the chord tolerance, in both units (shoelace formula)', () => {
    const plateArea = Math.abs(shoelace(plate.outline))
    const tolerance = 0.1
    const bound = perimeter(plate.outline) * tolerance
    const mm = vertices(outlineOf(parse(renderCutDxf(plate, { units: 'mm' }))))
    expect(Math.abs(shoelace(mm) - plateArea)).toBeLessThanOrEqual(bound)
    const inch = vertices(outlineOf(parse(renderCutDxf(plate, { units: 'in' }))))
    expect(Math.abs(shoelace(inch) * IN * IN - plateArea)).toBeLessThanOrEqual(bound)
    // Counter-clockwise, like the plate (positive shoelace area).
    expect(shoelace(mm)).toBeGreaterThan(0)
  })

  it('thins the outline for a coarser tolerance and keeps every true point within it', () => {
    const dxf = parse(renderCutDxf(plate, { units: 'mm', chordTolerance: 0.5 }))
    const coarse = vertices(outlineOf(dxf))
    expect(coarse.length).toBeLessThan(plate.outline.length / 3)
    const worst = Math.max(...plate.outline.map((p) => distanceToPolygon(p, coarse)))
    // 0.4 mm of thinning on top of the outline's own 0.1 mm chord error.
    expect(worst).toBeLessThanOrEqual(0.4 + 1e-9)
    expect(Math.abs(shoelace(coarse) - shoelace(plate.outline))).toBeLessThanOrEqual(perimeter(plate.outline) * 0.5)
  })

  it('flattens the cubic outline path for a tolerance finer than the polygon', () => {
    // Four-cubic circle: its radius is r to r(1 + 2.7e-4) (well-known kappa approximation, from memory).
    const r = 300
    const circlePlate = fixturePlate({ radius: r, amplitude: 0, cubicCircle: true, segments: 64 })
    const tol = 0.02
    const fine = vertices(outlineOf(parse(renderCutDxf(circlePlate, { units: 'mm', chordTolerance: tol }))))
    for (let i = 0; i < fine.length; i++) {
      const a = fine[i]!
      const b = fine[(i + 1) % fine.length]!
      expect(Math.hypot(a[0], a[1])).toBeGreaterThanOrEqual(r - 1e-6)
      expect(Math.hypot(a[0], a[1])).toBeLessThanOrEqual(r * (1 + 2.8e-4))
      // The chord's midpoint may fall inside the curve by at most the tolerance.
      expect(Math.hypot((a[0] + b[0]) / 2, (a[1] + b[1]) / 2)).toBeGreaterThanOrEqual(r - tol)
    }
  })

  it('writes round holes as circles of the right diameter (CIRCLE group 40 = radius)', () => {
    const dxf = parse(renderCutDxf(plate, { units: 'in' }))
    const inside = onLayer<ICircleEntity>(dxf, LAYER_INSIDE, 'CIRCLE')
    // Routed openings are inside profiles; drilled holes (centre, index) go to the drill layer.
    const through = plate.holes.filter((h) => h.method === 'routed')
    expect(inside).toHaveLength(through.length)
    for (const h of through) {
      const match = inside.find((c) => Math.abs(c.center.x - h.x / IN) < 1e-6 && Math.abs(c.center.y - h.y / IN) < 1e-6)
      expect(match, h.id).toBeDefined()
      expect(match!.radius * 2 * IN).toBeCloseTo(h.diameter, 6)
    }
  })

  it('puts rabbets on a layer named with their depth, and drill points on the drill layer', () => {
    const dxf = parse(renderCutDxf(plate, { units: 'in' }))
    // 9.525 mm = 0.375 in
    expect(rabbetLayerName(9.525, 'in')).toBe('RP-RABBET-0.375IN')
    const rabbets = onLayer<ICircleEntity>(dxf, 'RP-RABBET-0.375IN', 'CIRCLE')
    expect(rabbets).toHaveLength(plate.rabbets.length)
    expect(rabbets[0]!.radius * 2 * IN).toBeCloseTo(plate.rabbets[0]!.diameter, 6)
    const drills = onLayer<ICircleEntity>(dxf, LAYER_DRILL, 'CIRCLE')
    // Centre and index holes register the layers: drilled. The caster bolts go through the pan's
    // steel, not the plywood, so they are not drilled (they are drawn on the reference layer).
    const drilled = plate.holes.filter((h) => h.kind === 'index' || h.kind === 'centre')
    expect(drills).toHaveLength(drilled.length)
    for (const h of drilled) {
      expect(drills.some((c) => Math.abs(c.center.x - h.x / IN) < 1e-6 && Math.abs(c.center.y - h.y / IN) < 1e-6 && Math.abs(c.radius * 2 * IN - h.diameter) < 1e-6), h.id).toBe(true)
    }
    expect(dxf.tables.layer.layers['RP-RABBET-0.375IN']).toBeDefined()
    const mm = parse(renderCutDxf(plate, { units: 'mm' }))
    expect(onLayer(mm, 'RP-RABBET-9.525MM', 'CIRCLE')).toHaveLength(plate.rabbets.length)
  })

  it('keeps reference marks off the cut layers, and leaves them out on request', () => {
    const withRef = parse(renderCutDxf(plate, { units: 'mm' }))
    const ref = withRef.entities.filter((e) => e.layer === LAYER_REFERENCE)
    // trunk circle + clocking axis + one outline per caster plate + its bolts (through the pan, drawn only)
    const bolts = plate.casterMounts.reduce((n, m) => n + m.bolts.length, 0)
    expect(ref).toHaveLength(2 + plate.casterMounts.length + bolts)
    const trunk = onLayer<ICircleEntity>(withRef, LAYER_REFERENCE, 'CIRCLE').filter((c) => Math.hypot(c.center.x, c.center.y) < 1e-9)
    expect(trunk).toHaveLength(1)
    expect(trunk[0]!.radius * 2).toBeCloseTo(plate.trunk.diameter, 6)
    const noRef = parse(renderCutDxf(plate, { units: 'mm', includeReference: false }))
    expect(noRef.entities.filter((e) => e.layer === LAYER_REFERENCE)).toHaveLength(0)
    expect(noRef.entities.length).toBe(withRef.entities.length - ref.length)
  })

  it('has no text or dimensions on cut layers and no duplicate entities (CNC practice, common practice)', () => {
    const dupPlate: Plate = { ...plate, holes: [...plate.holes, { ...plate.holes[0]!, id: 'copy' }] }
    const dxf = parse(renderCutDxf(dupPlate, { units: 'mm' }))
    const cutLayers = new Set(dxf.entities.map((e) => e.layer).filter((l) => l !== LAYER_REFERENCE && l !== LAYER_NOTES))
    expect(cutLayers.size).toBeGreaterThanOrEqual(4)
    // Text is allowed only on the notes layer, which is never cut.
    for (const e of dxf.entities.filter((x) => x.layer !== LAYER_NOTES)) {
      expect(['TEXT', 'MTEXT', 'DIMENSION']).not.toContain(e.type)
    }
    const keys = dxf.entities.filter((e) => e.layer !== LAYER_NOTES).map((e) => {
      if (e.type === 'CIRCLE') {
        const c = e as ICircleEntity
        return `${e.layer} C ${c.center.x.toFixed(6)} ${c.center.y.toFixed(6)} ${c.radius.toFixed(6)}`
      }
      if (e.type === 'LWPOLYLINE') return `${e.layer} P ${vertices(e as ILwpolylineEntity).map((p) => p.map((v) => v.toFixed(6)).join(',')).join(' ')}`
      return `${e.layer} ${e.type} ${JSON.stringify(e)}`
    })
    expect(new Set(keys).size).toBe(keys.length)
    expect(onLayer(dxf, LAYER_INSIDE, 'CIRCLE')).toHaveLength(plate.holes.filter((h) => h.method === 'routed').length)
  })

  it('mirrors x for cutting the bottom layer from the back, keeping the outline counter-clockwise', () => {
    const normal = parse(renderCutDxf(plate, { units: 'mm', layer: 'bottom' }))
    const mirrored = parse(renderCutDxf(plate, { units: 'mm', mirror: true, layer: 'bottom' }))
    const key = (p: Point) => `${p[0].toFixed(4)} ${p[1].toFixed(4)}`
    const a = new Set(vertices(outlineOf(normal)).map(([x, y]) => key([-x, y])))
    const b = vertices(outlineOf(mirrored))
    expect(b.every((p) => a.has(key(p)))).toBe(true)
    expect(shoelace(b)).toBeGreaterThan(0)
    const holes = onLayer<ICircleEntity>(normal, LAYER_INSIDE, 'CIRCLE').map((c) => key([-c.center.x, c.center.y])).sort()
    const flipped = onLayer<ICircleEntity>(mirrored, LAYER_INSIDE, 'CIRCLE').map((c) => key([c.center.x, c.center.y])).sort()
    expect(flipped).toEqual(holes)
    // The fixture has pockets off the axis, so mirroring really moves something.
    expect(flipped).not.toEqual(onLayer<ICircleEntity>(normal, LAYER_INSIDE, 'CIRCLE').map((c) => key([c.center.x, c.center.y])).sort())
  })
})
