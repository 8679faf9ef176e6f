// Tube notches only where a pan or its rim lies under the tube wall, as high as
// what is under it (issue 23, item 15); the pan tuck that allows for a tube not
// quite round is a setting. Hand values on the default hardware: a 12-1/2 in
// tube (outside radius 158.75 mm) with a 1/4 in wall (inside radius 152.4 mm);
// 4-1/4 in pockets (radius 53.975 mm), 1/2 in rabbet rings (rim radius
// 66.675 mm), pan depth 1-1/4 in over a 3/8 in rabbet: the pan rises
// 31.75 - 9.525 = 22.225 mm above the top face. The clearance over the crown
// (1/2 in) and the rim relief (1/8 in) are common practice from memory.
import { describe, expect, it } from 'vitest'
import { buildPlate, plateParamsSchema } from '../../../geometry/core'
import { placeCasters } from '../../../geometry/features/placement'
import { tubeWrapLayout } from '../../../geometry/export/tube-wrap-pdf'

const DEG = Math.PI / 180

/** The span (degrees) of the wall ring [ri, ro] that a circle covers, by brute force over radius and angle. */
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

describe('what lies under the tube wall sets the notch', () => {
  it('default plate: only the rims reach under the wall (144.475 < 152.4 < 157.175 mm), so a 1/8 in relief and no tall notch', () => {
    const plate = buildPlate(plateParamsSchema.parse({}))
    // Body: 90.5 + 53.975 = 144.475 mm, inside the wall's inside face (152.4). Rim: 90.5 + 66.675 = 157.175, in the wall.
    expect(plate.notches).toHaveLength(3)
    for (const n of plate.notches) {
      expect(n.body).toBeNull()
      expect(n.height).toBeCloseTo(3.175, 9)
      expect(n.rimHeight).toBeCloseTo(3.175, 9)
    }
    // The tube wrap cuts each notch at that relief, not at the pan's full height.
    for (const w of tubeWrapLayout(plate).notches) {
      expect(w.height).toBeCloseTo(3.175, 9)
      expect(w.bodyWidth).toBeCloseTo(w.width, 9)
    }
  })

  it('pans at 150 mm reach under the wall with their bodies: 22.225 + 12.7 = 34.925 mm over the body, 3.175 mm over the rim at the sides', () => {
    const params = plateParamsSchema.parse({ casterOffset: 150 })
    const plate = buildPlate(params)
    const ro = 158.75
    const ri = 152.4
    plate.notches.forEach((n, k) => {
      const rb = plate.rabbets[k]!
      expect(n.height).toBeCloseTo(34.925, 9)
      expect(n.rimHeight).toBeCloseTo(3.175, 9)
      // The whole notch spans the rim's circle in the wall; the tall middle the pocket's (the pan body's) circle.
      expect(n.span).toBeCloseTo(bruteSpan(ro, ri, rb.x, rb.y, 66.675), 1)
      expect(n.body!.span).toBeCloseTo(bruteSpan(ro, ri, rb.x, rb.y, 53.975), 1)
      expect(n.body!.span).toBeLessThan(n.span)
      expect(n.body!.width).toBeCloseTo(ro * n.body!.span * DEG, 9)
    })
    const wrap = tubeWrapLayout(plate).notches[1]!
    expect(wrap.height).toBeCloseTo(34.925, 9)
    expect(wrap.rimHeight).toBeCloseTo(3.175, 9)
    expect(wrap.bodyWidth).toBeCloseTo(plate.notches[1]!.body!.width, 9)
  })

  it('a flat plate in the rabbet (pan depth 0) under the wall is notched only for the caster\'s nuts above it: 0 + 12.7 mm', () => {
    const plate = buildPlate(plateParamsSchema.parse({ casterOffset: 150, panDepth: 0 }))
    // Rise max(0, 0 - 9.525) = 0, plus the 12.7 mm clearance for the caster's bolts above a flat plate.
    for (const n of plate.notches) expect(n.height).toBeCloseTo(12.7, 9)
  })

  it('pans well inside the wall need no notch at all: 2 in pockets (rims 1-1/2 in) at 80 mm reach 118.1 mm, short of 152.4', () => {
    // Rim radius 25.4 + 12.7 = 38.1 mm; 80 + 38.1 = 118.1 mm.
    expect(buildPlate(plateParamsSchema.parse({ casterOffset: 80, pocketDiameter: 50.8, caster: { wheelDiameter: 38.1, swivelLead: 6, treadWidth: 12, topPlateWidth: 30, topPlateLength: 30, boltSpacingX: 20, boltSpacingY: 20, racewayDiameter: 12, boltDiameter: 4 } })).notches).toEqual([])
  })
})

describe('the pan tuck is a setting', () => {
  it('default 1.5 mm: the pans hide up to 158.75 - 66.675 - 1.5 = 90.575 mm; a 1/8 in tuck, 88.9 mm (placed at 88.5 on the 0.5 mm step)', () => {
    const base = placeCasters(plateParamsSchema.parse({}))
    expect(base.hiddenMax).toBeCloseTo(90.575, 9)
    const tucked = placeCasters(plateParamsSchema.parse({ panTuck: 3.175 }))
    expect(tucked.hiddenMax).toBeCloseTo(88.9, 9)
    expect(tucked.offset).toBe(88.5)
  })

  it('refuses a tuck below zero or over an inch with a field message', () => {
    const r = plateParamsSchema.safeParse({ panTuck: -1 })
    expect(r.success).toBe(false)
    expect(r.error!.issues[0]!.path).toEqual(['panTuck'])
    expect(plateParamsSchema.safeParse({ panTuck: 30 }).success).toBe(false)
  })
})
