import { describe, expect, it } from 'vitest'
import { buildPlate } from '../../../geometry/plate'
import { plateParamsSchema } from '../../../geometry/params'
import { HOLE_SAW_INCHES, snapToHoleSaw } from '../../../geometry/features/holes'
import { floorStack } from '../../../geometry/checks/floor'
import { presetParams } from '../../../geometry/presets'
import { shoelace, threeInch } from './helpers'

const DEG = Math.PI / 180

describe('pockets', () => {
  it.each([3, 4, 5, 8])('%i pockets sit exactly on the caster circle at rotation + k * 360 / n', (n) => {
    const params = plateParamsSchema.parse({ casterCount: n, casterOffset: 260, rotation: 17, lobes: { count: 0 } })
    const plate = buildPlate(params)
    const pockets = plate.holes.filter((h) => h.kind === 'pocket')
    expect(pockets).toHaveLength(n)
    pockets.forEach((p, k) => {
      expect(Math.hypot(p.x, p.y)).toBeCloseTo(260, 9)
      const expected = 17 + (k * 360) / n
      expect(Math.cos(Math.atan2(p.y, p.x) - expected * DEG)).toBeCloseTo(1, 12)
    })
    // Neighbouring pockets are a chord 2 R sin(pi / n) apart (circle geometry).
    const [a, b] = pockets
    expect(Math.hypot(a!.x - b!.x, a!.y - b!.y)).toBeCloseTo(2 * 260 * Math.sin(Math.PI / n), 9)
  })

  it('ring each pocket with a rabbet of pocket + 2 x rabbet width at the rabbet depth', () => {
    const params = plateParamsSchema.parse({})
    const plate = buildPlate(params)
    for (const rb of plate.rabbets) {
      expect(rb.diameter).toBeCloseTo(params.pocketDiameter + 2 * params.rabbetWidth, 12)
      expect(rb.depth).toBe(params.rabbetDepth)
    }
  })
})

describe('access openings, centre and index holes', () => {
  it('puts one opening halfway between each pair of casters', () => {
    const params = plateParamsSchema.parse({ casterCount: 4, rotation: 0, casterOffset: 200, access: { offset: 60, diameter: 38.1 } })
    const access = buildPlate(params).holes.filter((h) => h.kind === 'access')
    expect(access.map((h) => Math.round(Math.atan2(h.y, h.x) / DEG))).toEqual([45, 135, -135, -45])
    for (const h of access) expect(Math.hypot(h.x, h.y)).toBeCloseTo(60, 9)
  })

  it('snaps openings to hole-saw sizes, 3/4 to 6 in (common practice, from memory)', () => {
    expect(HOLE_SAW_INCHES[0]).toBe(0.75)
    expect(HOLE_SAW_INCHES[HOLE_SAW_INCHES.length - 1]).toBe(6)
    expect(snapToHoleSaw(60)).toBeCloseTo(2.375 * 25.4, 9)
    expect(snapToHoleSaw(10)).toBeCloseTo(0.75 * 25.4, 9)
    // Past the largest saw it is a router-pattern hole, left as asked.
    expect(snapToHoleSaw(200)).toBe(200)
    const plate = buildPlate(plateParamsSchema.parse({ access: { diameter: 60 } }))
    expect(plate.holes.find((h) => h.kind === 'access')!.diameter).toBeCloseTo(60.325, 9)
    const exact = buildPlate(plateParamsSchema.parse({ access: { diameter: 60, snapToHoleSaw: false } }))
    expect(exact.holes.find((h) => h.kind === 'access')!.diameter).toBe(60)
  })

  it('drills the centre hole at the origin and index holes on the clocking axis, moved along it where a pan is in the way', () => {
    // Three casters at 90, 210, 330 deg. At 90 deg pocket 0's rabbet (90.5 + 66.675 = 157.175 mm out)
    // covers the tube-wall spot at 158.75: the hole moves out along the axis until it clears the
    // rabbet by 1/4 in, 157.175 + 6.35 + 1.5875 = 165.1125 mm, on 0.5 mm steps. At 270 deg the
    // access opening reaches 125 + 25.4 = 150.4 mm, and 158.75 - 1.5875 - 150.4 = 6.76 >= 6.35: it stays.
    const params = plateParamsSchema.parse({})
    const plate = buildPlate(params)
    const centre = plate.holes.find((h) => h.kind === 'centre')!
    expect([centre.x, centre.y, centre.diameter]).toEqual([0, 0, params.centreHoleDiameter])
    expect(centre.method).toBe('drill')
    const index = plate.holes.filter((h) => h.kind === 'index')
    expect(index.map((h) => h.id)).toEqual(['index-0', 'index-1'])
    expect(index.every((h) => h.method === 'drill')).toBe(true)
    expect(index[0]!.x).toBeCloseTo(0, 9)
    expect(index[0]!.y).toBeGreaterThanOrEqual(165.1125)
    expect(index[0]!.y).toBeLessThan(165.1125 + 0.5)
    expect(index[1]!.x).toBeCloseTo(0, 9)
    expect(index[1]!.y).toBeCloseTo(-params.tubeDiameter / 2, 9)
    expect(plate.axis.angle).toBe(90)
  })

  it('moves an index hole inward along the axis when outward is too far (the slim birch)', () => {
    // 8-1/2 in tube: pocket 0 at 89 mm, rabbet radius 66.675, covers 22.325 to 155.675 mm on the 90 deg axis.
    // Outward it would need 155.675 + 6.35 + 1.5875 = 163.6 mm, past the 107.95 + 53.975 reach; inward it fits
    // at 22.325 - 6.35 - 1.5875 = 14.3875 mm or less (0.5 mm steps from the wall at 107.95).
    const hole = buildPlate(presetParams('slim-birch')!).holes.find((h) => h.id === 'index-0')!
    expect(hole.x).toBeCloseTo(0, 9)
    expect(hole.y).toBeLessThanOrEqual(14.3875)
    expect(hole.y).toBeGreaterThan(14.3875 - 0.5)
  })

  it('turns an index hole to the nearest free angle when the whole axis is taken', () => {
    // A 16 in pocket with a 1/2 in rabbet at 240 mm covers the 90 deg line from 24.3 to 455.7 mm.
    // A 1 in index hole needs 6.35 + 12.7 mm beyond that: out to 474.75, past the search's reach
    // (300 + 150 mm), or in to 5.25 mm, inside the centre hole's 3.175 + 6.35 + 12.7 mm. So it turns
    // off the axis, clear of every hole by 1/4 in; the opposite one stays at the wall.
    const params = plateParamsSchema.parse({ tubeDiameter: 600, casterCount: 3, casterOffset: 240, pocketDiameter: 406.4, indexHoleDiameter: 25.4, access: { enabled: false } })
    const plate = buildPlate(params)
    const index = plate.holes.filter((h) => h.kind === 'index')
    expect(index).toHaveLength(2)
    expect(Math.abs(Math.atan2(index[0]!.y, index[0]!.x) / DEG - 90)).toBeGreaterThan(1)
    expect(index[1]!.y).toBeCloseTo(-300, 9)
    const others = [...plate.rabbets.map((r) => ({ x: r.x, y: r.y, r: r.diameter / 2 })), ...plate.holes.filter((h) => h.kind !== 'index' && h.kind !== 'pocket').map((h) => ({ x: h.x, y: h.y, r: h.diameter / 2 }))]
    for (const h of index) {
      for (const o of others) expect(Math.hypot(h.x - o.x, h.y - o.y) - o.r - h.diameter / 2).toBeGreaterThanOrEqual(6.35 - 1e-9)
    }
  })

  it('keeps both index holes where no pocket covers the axis', () => {
    const params = plateParamsSchema.parse({ casterOffset: 300, lobes: { count: 0 } })
    expect(buildPlate(params).holes.filter((h) => h.kind === 'index')).toHaveLength(2)
  })
})

describe('caster top plates', () => {
  it('are turned square to the radial line, with the bolt pattern centred on the kingpin', () => {
    const params = plateParamsSchema.parse({ casterCount: 5, rotation: 23 })
    const plate = buildPlate(params)
    const c = params.caster
    plate.casterMounts.forEach((m, k) => {
      const pocket = plate.holes.find((h) => h.id === m.pocketId)!
      const u = [Math.cos(m.angle * DEG), Math.sin(m.angle * DEG)]
      const [p0, p1, p2] = m.corners
      const e1 = [p1![0] - p0![0], p1![1] - p0![1]]
      const e2 = [p2![0] - p1![0], p2![1] - p1![1]]
      // First edge runs along the radius (width), the next across it (length).
      expect(e1[0]! * u[1]! - e1[1]! * u[0]!).toBeCloseTo(0, 9)
      expect(Math.hypot(e1[0]!, e1[1]!)).toBeCloseTo(c.topPlateWidth, 9)
      expect(e2[0]! * u[0]! + e2[1]! * u[1]!).toBeCloseTo(0, 9)
      expect(Math.hypot(e2[0]!, e2[1]!)).toBeCloseTo(c.topPlateLength, 9)
      expect(shoelace(m.corners)).toBeGreaterThan(0)
      expect(m.angle).toBeCloseTo(23 + k * 72, 9)
      for (const b of m.bolts) {
        expect(Math.hypot(b.x - pocket.x, b.y - pocket.y)).toBeCloseTo(Math.hypot(c.boltSpacingX, c.boltSpacingY) / 2, 9)
      }
    })
  })

  it('flag bolts that land on the swivel raceway', () => {
    // 3 in caster: bolts sit hypot(73.025, 44.45) / 2 = 42.74 mm from the kingpin; less their 3.97 mm radius, 38.78 mm.
    const clear = buildPlate(plateParamsSchema.parse(threeInch({ caster: { racewayDiameter: 2 * 38.7 } })))
    expect(clear.findings.map((f) => f.code)).not.toContain('bolt-in-raceway')
    const hit = buildPlate(plateParamsSchema.parse(threeInch({ caster: { racewayDiameter: 2 * 38.9 } })))
    const found = hit.findings.filter((f) => f.code === 'bolt-in-raceway')
    expect(found).toHaveLength(3)
    expect(found[0]!.field).toBe('caster.racewayDiameter')
    expect(found[0]!.severity).toBe('error')
  })
})

describe('tube notches', () => {
  /** The notch span found by brute force: every point of the wall ring inside the rabbet circle, by its angle. */
  function bruteSpan(ro: number, ri: number, cx: number, cy: number, rho: number): number {
    const centre = Math.atan2(cy, cx)
    let widest = 0
    for (let i = 0; i <= 100; i++) {
      const s = ri + ((ro - ri) * i) / 100
      for (let j = -9000; j <= 9000; j++) {
        const a = centre + (j / 9000) * Math.PI
        if (Math.hypot(s * Math.cos(a) - cx, s * Math.sin(a) - cy) <= rho) widest = Math.max(widest, Math.abs(a - centre))
      }
    }
    return (2 * widest) / DEG
  }

  it.each([
    [{}],
    [{ tubeWall: 20, casterOffset: 140, pocketDiameter: 120 }],
    [{ casterOffset: 150, casterCount: 4, rotation: 10 }],
  ])('span and unrolled width match a brute-force search of the tube wall (%j)', (input) => {
    const params = plateParamsSchema.parse(input)
    const plate = buildPlate(params)
    const ro = params.tubeDiameter / 2
    const ri = ro - params.tubeWall
    expect(plate.notches.length).toBe(params.casterCount)
    plate.notches.forEach((n, k) => {
      const rb = plate.rabbets[k]!
      expect(n.span).toBeCloseTo(bruteSpan(ro, ri, rb.x, rb.y, rb.diameter / 2), 1)
      expect(n.width).toBeCloseTo(ro * n.span * DEG, 9)
      expect(n.endAngle - n.startAngle).toBeCloseTo(n.span, 9)
      expect(n.offsetAlongWrap).toBeCloseTo(ro * ((k * 360) / params.casterCount) * DEG, 9)
    })
  })

  it('are not cut where the pans stay clear of the wall', () => {
    const params = plateParamsSchema.parse({ casterOffset: 400, lobes: { count: 0 } })
    expect(buildPlate(params).notches).toEqual([])
  })
})

describe('floor gap (the stack model in geometry/checks/floor.ts)', () => {
  it('worked example, a plate on 3 in casters, by hand', () => {
    // Plate T = 2 x 17.8562 = 35.7124 mm. Pan rim on the rabbet floor 9.525 mm down, so the rim
    // underside is 35.7124 - 9.525 = 26.1874 mm above the plate's underside. The pan rises 63.5 mm
    // to its crown: caster seat at 26.1874 + 63.5 = 89.6874 mm. A 101.6 mm caster puts the floor
    // 101.6 - 89.6874 = 11.9126 mm below the plate.
    const params = plateParamsSchema.parse(threeInch())
    const stack = floorStack(params)
    expect(stack.thickness).toBeCloseTo(35.7124, 9)
    expect(stack.seatHeight).toBeCloseTo(89.6874, 9)
    expect(stack.floorGap).toBeCloseTo(11.9126, 9)
    expect(buildPlate(params).metrics.floorGap).toBeCloseTo(11.9126, 9)
    // The gap (11.9) is below the wheel's axle (38.1): the wheel's widest part swings inside
    // the pocket, lead + radius = 31.75 + 38.1 = 69.85 mm from the kingpin.
    expect(stack.wheelReach).toBeCloseTo(69.85, 9)
    // Its 1-1/4 in tread's edge is hypot(69.85, 15.875) = 71.6313 mm out; with the 1/4 in clearance 77.9813.
    expect(stack.swivelRadius).toBeCloseTo(Math.sqrt(69.85 ** 2 + 15.875 ** 2) + 6.35, 9)
    expect(stack.swivelRadius).toBeCloseTo(77.9813, 3)
  })

  it('worked example, the default plate on 2 in casters, by hand', () => {
    // T = 2 x 23/32 in = 36.5125; seat = 36.5125 - 9.525 + 31.75 = 58.7375; gap = 66.675 - 58.7375 = 7.9375 mm,
    // below the 25.4 mm axle: reach = 19.05 + 25.4 = 44.45; tread edge hypot(44.45, 9.525) = 45.4591;
    // with the 6.35 clearance 51.8091 mm, inside the 4-1/4 in pocket's 53.975 mm radius.
    const params = plateParamsSchema.parse({})
    const stack = floorStack(params)
    expect(stack.floorGap).toBeCloseTo(7.9375, 9)
    expect(stack.wheelReach).toBeCloseTo(44.45, 9)
    expect(stack.swivelRadius).toBeCloseTo(51.8091, 3)
    expect(buildPlate(params).findings.map((f) => f.code)).not.toContain('wheel-swing')
  })

  it('worked example, a flat plate in the rabbet of two 3/4 in sheets', () => {
    // T = 38.1; seat = 38.1 - 9.525 + 0 = 28.575; gap = 101.6 - 28.575 = 73.025 mm.
    // Wheel radius 38.1: the underside is 73.025 - 38.1 = 34.925 above the axle, where the wheel's
    // half-chord is sqrt(38.1^2 - 34.925^2) = 15.2270; reach = 31.75 + 15.2270 = 46.9770 mm.
    const stack = floorStack(plateParamsSchema.parse(threeInch({ sheetThickness: 19.05, panDepth: 0 })))
    expect(stack.floorGap).toBeCloseTo(73.025, 9)
    expect(stack.wheelReach).toBeCloseTo(46.977, 3)
  })

  it('reports a negative gap as an error and a small one as a warning', () => {
    const codes = (input: Record<string, unknown>) => buildPlate(plateParamsSchema.parse(threeInch(input))).findings.map((f) => f.code)
    // gap = 101.6 - (26.1874 + 80) = -4.5874
    expect(codes({ panDepth: 80 })).toContain('floor-gap-negative')
    // gap = 101.6 - (26.1874 + 70) = 5.4126 < 6.35
    expect(codes({ panDepth: 70 })).toContain('floor-gap-small')
    expect(codes({ panDepth: 70, minFloorGap: 5 })).not.toContain('floor-gap-small')
  })
})
