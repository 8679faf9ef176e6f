// Independent checks used by the geometry tests. Written here from first
// principles, not imported from the library under test.

import fc from 'fast-check'
import { plateParamsSchema, type PlateParams } from '../../../geometry/params'

export type Pt = readonly [number, number]

function orient(a: Pt, b: Pt, c: Pt): number {
  return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
}

function onSegment(a: Pt, b: Pt, p: Pt): boolean {
  return Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) && Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1])
}

/** Whether closed segments ab and cd share a point (touching counts). */
export function segmentsIntersect(a: Pt, b: Pt, c: Pt, d: Pt): boolean {
  const o1 = orient(a, b, c)
  const o2 = orient(a, b, d)
  const o3 = orient(c, d, a)
  const o4 = orient(c, d, b)
  if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) return true
  if (o1 === 0 && onSegment(a, b, c)) return true
  if (o2 === 0 && onSegment(a, b, d)) return true
  if (o3 === 0 && onSegment(c, d, a)) return true
  if (o4 === 0 && onSegment(c, d, b)) return true
  return false
}

/**
 * First pair of non-adjacent edges of a closed ring that meet, or null.
 * Edges are bucketed in a uniform grid about twice the mean edge length, so
 * only edges sharing a cell are compared: close to linear for an outline.
 */
export function findSelfIntersection(ring: readonly Pt[]): [number, number] | null {
  const n = ring.length
  let total = 0
  let minX = Infinity
  let minY = Infinity
  for (let i = 0; i < n; i++) {
    const a = ring[i]!
    const b = ring[(i + 1) % n]!
    total += Math.hypot(b[0] - a[0], b[1] - a[1])
    minX = Math.min(minX, a[0])
    minY = Math.min(minY, a[1])
  }
  const cell = Math.max((2 * total) / n, 1e-6)
  const grid = new Map<string, number[]>()
  for (let i = 0; i < n; i++) {
    const a = ring[i]!
    const b = ring[(i + 1) % n]!
    const x0 = Math.floor((Math.min(a[0], b[0]) - minX) / cell)
    const x1 = Math.floor((Math.max(a[0], b[0]) - minX) / cell)
    const y0 = Math.floor((Math.min(a[1], b[1]) - minY) / cell)
    const y1 = Math.floor((Math.max(a[1], b[1]) - minY) / cell)
    for (let gx = x0; gx <= x1; gx++) {
      for (let gy = y0; gy <= y1; gy++) {
        const key = `${gx},${gy}`
        const list = grid.get(key)
        if (list) list.push(i)
        else grid.set(key, [i])
      }
    }
  }
  for (const list of grid.values()) {
    for (let p = 0; p < list.length; p++) {
      for (let q = p + 1; q < list.length; q++) {
        const i = list[p]!
        const j = list[q]!
        const adjacent = Math.abs(i - j) === 1 || Math.abs(i - j) === n - 1
        if (adjacent) continue
        if (segmentsIntersect(ring[i]!, ring[(i + 1) % n]!, ring[j]!, ring[(j + 1) % n]!)) return [i, j]
      }
    }
  }
  return null
}

export function shoelace(ring: readonly Pt[]): number {
  let s = 0
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!
    const b = ring[(i + 1) % ring.length]!
    s += a[0] * b[1] - b[0] * a[1]
  }
  return s / 2
}

/** A circle as a regular polygon of n vertices, counter-clockwise. */
export function circleRing(x: number, y: number, r: number, n = 2048): [number, number][] {
  const ring: [number, number][] = []
  for (let i = 0; i < n; i++) {
    const a = (2 * Math.PI * i) / n
    ring.push([x + r * Math.cos(a), y + r * Math.sin(a)])
  }
  return ring
}

/** Every number anywhere inside a value. */
export function allNumbers(value: unknown, out: number[] = []): number[] {
  if (typeof value === 'number') out.push(value)
  else if (Array.isArray(value)) for (const v of value) allNumbers(v, out)
  else if (value && typeof value === 'object') for (const v of Object.values(value)) allNumbers(v, out)
  return out
}

const real = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true })

/**
 * Raw parameter objects drawn inside each field's documented bounds. A few
 * lengths are drawn as fractions of a related one (bolt spacing of the top
 * plate, caster offset beyond the pocket) so that enough of them pass the
 * cross-field rules; the schema still has the last word.
 */
export const rawParams = fc
  .record({
    tubeDiameter: real(101.6, 1244.6),
    tubeWall: real(1, 25.4),
    casterCount: fc.integer({ min: 3, max: 8 }),
    offsetBeyond: real(0, 1),
    pocketDiameter: real(38.1, 406.4),
    rabbetWidth: real(3, 50),
    rabbetDepth: real(1, 30),
    panDepth: real(0, 250),
    wheelDiameter: real(38.1, 203.2),
    leadFraction: real(0, 0.99),
    heightExtra: real(1, 150),
    topPlateWidth: real(25.4, 203.2),
    topPlateLength: real(25.4, 254),
    boltX: real(0, 1),
    boltY: real(0, 1),
    boltDiameter: real(3, 16),
    racewayFraction: real(0.1, 1),
    rotation: real(-360, 360),
    lobes: fc.record({
      count: fc.integer({ min: 0, max: 24 }),
      reach: real(0, 900),
      width: real(10, 1200),
      roundness: real(0, 1),
      irregularity: real(0, 1),
      seed: fc.integer({ min: 0, max: 0xffffffff }),
      valley: real(6, 300),
      phase: real(-180, 180),
      overrides: fc.array(
        fc.record(
          { index: fc.integer({ min: 0, max: 23 }), angle: real(-180, 180), reach: real(0, 900), width: real(10, 1200) },
          { requiredKeys: ['index'] },
        ),
        { maxLength: 4 },
      ),
    }),
    access: fc.record({ enabled: fc.boolean(), diameter: real(19.05, 304.8), offset: real(0, 600), snapToHoleSaw: fc.boolean() }),
    centreHoleDiameter: real(1, 50.8),
    indexHoleDiameter: real(1, 25.4),
    minWood: real(3, 100),
    layers: fc.integer({ min: 1, max: 4 }),
    sheetThickness: real(3, 40),
    minFloorGap: real(0, 100),
  })
  .map((r) => {
    const least = r.pocketDiameter / 2 + r.rabbetWidth + r.minWood + r.centreHoleDiameter / 2
    const boltDiameter = r.boltDiameter
    return {
      tubeDiameter: r.tubeDiameter,
      tubeWall: r.tubeWall,
      casterCount: r.casterCount,
      casterOffset: Math.min(1500, least + r.offsetBeyond * 600),
      pocketDiameter: r.pocketDiameter,
      rabbetWidth: r.rabbetWidth,
      rabbetDepth: r.rabbetDepth,
      panDepth: r.panDepth,
      caster: {
        wheelDiameter: r.wheelDiameter,
        swivelLead: r.wheelDiameter * r.leadFraction,
        overallHeight: Math.min(304.8, r.wheelDiameter + r.heightExtra),
        topPlateWidth: r.topPlateWidth,
        topPlateLength: r.topPlateLength,
        boltSpacingX: Math.max(10, (r.topPlateLength - boltDiameter) * r.boltX),
        boltSpacingY: Math.max(10, (r.topPlateWidth - boltDiameter) * r.boltY),
        boltDiameter,
        racewayDiameter: Math.max(10, Math.min(r.topPlateWidth, r.topPlateLength) * r.racewayFraction),
      },
      rotation: r.rotation,
      lobes: r.lobes,
      access: r.access,
      centreHoleDiameter: r.centreHoleDiameter,
      indexHoleDiameter: r.indexHoleDiameter,
      minWood: r.minWood,
      layers: r.layers,
      sheetThickness: r.sheetThickness,
      minFloorGap: r.minFloorGap,
    }
  })

/** Accepted parameter sets only: raw inputs the schema turns away are dropped. */
export const acceptedParams: fc.Arbitrary<PlateParams> = rawParams
  .map((raw) => plateParamsSchema.safeParse(raw))
  .filter((r) => r.success)
  .map((r) => (r.success ? r.data : plateParamsSchema.parse({})))

/**
 * A plate on 3 in casters: the round-one hardware (6-1/2 in pockets, 5/8 in
 * rabbet, 2-1/2 in pans, a 3 in caster 4 in tall with a 2-1/2 x 3-5/8 in top
 * plate) at a 170 mm offset. The worked examples below were done by hand on
 * these numbers; the test data owns them so a change of defaults leaves them true.
 */
export const THREE_INCH = {
  casterOffset: 170,
  // Two "3/4 in" panels labelled 0.703 in (PS 1-19, category 23/32): T = 35.7124 mm in the worked examples.
  sheetThickness: 0.703 * 25.4,
  pocketDiameter: 165.1,
  rabbetWidth: 15.875,
  panDepth: 63.5,
  caster: {
    wheelDiameter: 76.2,
    swivelLead: 31.75,
    overallHeight: 101.6,
    treadWidth: 31.75,
    topPlateWidth: 63.5,
    topPlateLength: 92.075,
    boltSpacingX: 73.025,
    boltSpacingY: 44.45,
    boltDiameter: 7.9375,
    racewayDiameter: 50.8,
  },
  access: { diameter: 57.15, offset: 100 },
} as const

/** THREE_INCH with changes on top (nested caster and access fields merged). */
export function threeInch(input: Record<string, unknown> = {}): Record<string, unknown> {
  const caster = { ...THREE_INCH.caster, ...(input.caster as object | undefined) }
  const access = { ...THREE_INCH.access, ...(input.access as object | undefined) }
  return { ...THREE_INCH, ...input, caster, access }
}
