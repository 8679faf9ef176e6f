// The lobe shape itself, measured on the built outline polygon (not on the
// core's own lobe records) and compared with hand values from the params:
// a tip stands tube/2 + valley + reach from the centre (the params' own
// definitions: tube diameter, valley line, reach beyond it), lobes sit every
// 360/n degrees from rotation + phase, a lobe is `width` wide (an arc length)
// where it leaves the valley line. The checks hold whatever rounds the tips
// or blends the crotches: they measure tips, spacing and widths, not radii.
import { describe, expect, it } from 'vitest'
import { buildPlate } from '../../../geometry/plate'
import { plateParamsSchema } from '../../../geometry/params'

// Our own test plate: four even lobes round a 16 in tube, pockets well inside
// the valley line so only the lobes shape the edge, no access openings.
const base = {
  tubeDiameter: 406.4,
  casterCount: 4,
  casterOffset: 125,
  rotation: 0,
  access: { enabled: false },
  lobes: { count: 4, reach: 120, width: 160, roundness: 0.5, irregularity: 0, seed: 7, phase: 0, valley: 50 },
}
type Lobes = Partial<typeof base.lobes> & { overrides?: { index: number; reach?: number; width?: number; angle?: number }[] }
const valleyRadius = 406.4 / 2 + 50 // 253.2 mm

function outlineOf(lobes: Lobes = {}, rest: Record<string, unknown> = {}) {
  return buildPlate(plateParamsSchema.parse({ ...base, ...rest, lobes: { ...base.lobes, ...lobes } })).outline
}

const polar = (outline: [number, number][]) => outline.map(([x, y]) => ({ a: (Math.atan2(y, x) * 180) / Math.PI, r: Math.hypot(x, y) }))
/** Signed difference of two angles, degrees in (-180, 180]. */
const turn = (a: number, b: number) => { const d = (((a - b) % 360) + 540) % 360 - 180; return d === -180 ? 180 : d }

/** The farthest outline point within +-half of `centre`: the tip of the lobe there. */
function tipNear(outline: [number, number][], centre: number, half = 44) {
  let best = { a: 0, r: -Infinity }
  for (const p of polar(outline)) if (Math.abs(turn(p.a, centre)) < half && p.r > best.r) best = p
  return best
}

/** Tips as the outline's local maxima of radius standing 10 mm or more beyond the valley line. */
function tips(outline: [number, number][]) {
  const p = polar(outline)
  return p.filter((q, i) => q.r > valleyRadius + 10 && q.r > p[(i + p.length - 1) % p.length]!.r && q.r >= p[(i + 1) % p.length]!.r)
}

/** Arc length, at the valley radius, of the part of the lobe near `centre` standing more than `above` mm beyond the valley line. */
function widthAt(outline: [number, number][], centre: number, above: number): number {
  const near = polar(outline).filter(q => Math.abs(turn(q.a, centre)) < 44 && q.r > valleyRadius + above).map(q => turn(q.a, centre))
  return ((Math.max(...near) - Math.min(...near)) * Math.PI / 180) * valleyRadius
}

describe('lobe count and placement', () => {
  it.each([3, 4, 5, 7])('%i lobes give that many tips on the outline, every 360/n degrees', (count) => {
    const found = tips(outlineOf({ count }))
    expect(found).toHaveLength(count)
    const angles = found.map(t => t.a).sort((a, b) => a - b)
    for (let i = 0; i < count; i++) expect(Math.abs(turn(angles[(i + 1) % count]!, angles[i]!) - 360 / count)).toBeLessThan(0.5)
  })

  it('no lobes: no tips, a plain rim', () => {
    expect(tips(outlineOf({ count: 0 }))).toHaveLength(0)
  })

  it.each([[0, 0], [20, 0], [0, 30], [-35, 10]])('phase %i and rotation %i put the first tip at their sum', (phase, rotation) => {
    const outline = outlineOf({ phase }, { rotation })
    for (let i = 0; i < 4; i++) {
      const expected = rotation + phase + 90 * i
      expect(Math.abs(turn(tipNear(outline, expected).a, expected))).toBeLessThan(0.5)
    }
  })
})

describe('reach, width and roundness', () => {
  it.each([60, 120, 200])('a reach of %i mm puts every tip tube/2 + valley + reach from the centre', (reach) => {
    const outline = outlineOf({ reach })
    for (let i = 0; i < 4; i++) expect(Math.abs(tipNear(outline, 90 * i).r - (valleyRadius + reach))).toBeLessThan(1.5)
  })

  it('every tip points straight out along its own angle (the tip is the farthest point of its lobe)', () => {
    const outline = outlineOf()
    for (let i = 0; i < 4; i++) {
      const tip = tipNear(outline, 90 * i)
      // Within a degree either side the radius only falls.
      expect(tipNear(outline, 90 * i + 3, 2).r).toBeLessThan(tip.r)
      expect(tipNear(outline, 90 * i - 3, 2).r).toBeLessThan(tip.r)
    }
  })

  it.each([160, 240, 320])('a width of %i mm is the lobe\'s width near the valley line (within 20 %), and widths scale with it (widths wide enough that the foot needs no widening for a 1/4 in bit)', (width) => {
    const measured = widthAt(outlineOf({ width }), 0, 3)
    expect(measured / width).toBeGreaterThan(0.8)
    expect(measured / width).toBeLessThan(1.05)
    const ratio = widthAt(outlineOf({ width }), 0, 3) / widthAt(outlineOf({ width: 160 }), 0, 3)
    expect(ratio).toBeCloseTo(width / 160, 1)
  })

  it('roundness fills the lobe out: at half its reach a rounder lobe is wider, and the tips stay where they were', () => {
    const half = [0, 0.5, 1].map(roundness => widthAt(outlineOf({ roundness }), 0, 60))
    expect(half[0]!).toBeLessThan(half[1]!)
    expect(half[1]!).toBeLessThan(half[2]!)
    for (const roundness of [0, 1]) expect(Math.abs(tipNear(outlineOf({ roundness }), 0).r - (valleyRadius + 120))).toBeLessThan(1.5)
  })
})

describe('per-lobe overrides', () => {
  it('an override moves and lengthens its own lobe and leaves the others as they were', () => {
    const plain = outlineOf()
    const changed = outlineOf({ overrides: [{ index: 2, reach: 200, angle: 10 }] })
    const tip = tipNear(changed, 190)
    expect(Math.abs(turn(tip.a, 190))).toBeLessThan(0.5)
    expect(Math.abs(tip.r - (valleyRadius + 200))).toBeLessThan(1.5)
    for (const a of [0, 90, 270]) {
      expect(Math.abs(tipNear(changed, a, 30).r - tipNear(plain, a, 30).r)).toBeLessThan(0.01)
      expect(Math.abs(turn(tipNear(changed, a, 30).a, tipNear(plain, a, 30).a))).toBeLessThan(0.01)
    }
  })

  it('a width override widens only its lobe', () => {
    const changed = outlineOf({ overrides: [{ index: 0, width: 240 }] })
    expect(widthAt(changed, 0, 10) / widthAt(outlineOf(), 0, 10)).toBeCloseTo(240 / 160, 1)
    expect(Math.abs(widthAt(changed, 180, 10) - widthAt(outlineOf(), 180, 10))).toBeLessThan(1)
  })
})

describe('irregularity and its seed', () => {
  it('the same seed always gives the same outline; another seed another one', () => {
    const a = outlineOf({ irregularity: 0.8, seed: 5 })
    expect(outlineOf({ irregularity: 0.8, seed: 5 })).toEqual(a)
    expect(outlineOf({ irregularity: 0.8, seed: 6 })).not.toEqual(a)
  })

  it('without irregularity the seed changes nothing', () => {
    expect(outlineOf({ irregularity: 0, seed: 1 })).toEqual(outlineOf({ irregularity: 0, seed: 2 }))
  })

  it('an irregular plate keeps each tip near its even place (a sixth of the spacing at most) and its reach within +-50 %', () => {
    for (const seed of [1, 5, 6, 42, 1337]) {
      const outline = outlineOf({ irregularity: 1, seed })
      for (let i = 0; i < 4; i++) {
        const tip = tipNear(outline, 90 * i, 30)
        expect(Math.abs(turn(tip.a, 90 * i))).toBeLessThanOrEqual(90 / 6 + 0.5)
        // The valley line itself wobbles by up to 40 % of the valley (50 mm): allow that too.
        expect(tip.r).toBeGreaterThan(valleyRadius - 20 + 120 * 0.5 - 1.5)
        expect(tip.r).toBeLessThan(valleyRadius + 20 + 120 * 1.5 + 1.5)
      }
    }
  })
})
