// Pan fasteners: what each kind puts in the cut file, the least wood round
// their holes and what stands below the plate, against hand arithmetic in
// inches (1 in = 25.4 mm, NIST SP 811). The stack: plate T = 2 x 0.703 in
// (PS 1-19, 23/32 performance category), rabbet 3/8 in deep, so the wood
// under a pan's rim is 1.406 - 0.375 = 1.031 in; the default floor gap is
// 2.625 - (1.406 - 0.375 + 1.25) = 0.344 in (caster height less the stack).
// The 1/8 in least wood for fasteners and the 1/4 in least floor gap are the
// product's own rules (from memory), tested as rules.
import { describe, expect, it } from 'vitest'
import { buildPlate, plateParamsSchema } from '../../../geometry'

const IN = 25.4
const FLOOR_WOOD = 2 * 0.703 - 0.375
const FLOOR_GAP = 2.625 - (2 * 0.703 - 0.375 + 1.25)

function build(fasteners: Record<string, unknown>) {
  // Sheets of 0.703 in, as the hand figures above take them (set here: the default is 23/32 in).
  return buildPlate(plateParamsSchema.parse({ fasteners, sheetThickness: 0.703 * 25.4 }))
}
const codes = (fasteners: Record<string, unknown>) => build(fasteners).findings.map((f) => f.code)
const finding = (fasteners: Record<string, unknown>, code: string) => build(fasteners).findings.find((f) => f.code === code)

describe('pan fastener kinds', () => {
  it('reads a revision saved before the kind existed as screws, with the same count, size and circle', () => {
    const old = plateParamsSchema.parse({ fasteners: { count: 6, diameter: 5, boltCircleDiameter: 120 } })
    expect(old.fasteners).toMatchObject({ kind: 'screw', count: 6, diameter: 5, boltCircleDiameter: 120 })
    expect(plateParamsSchema.parse({}).fasteners.kind).toBe('screw')
  })

  it('refuses an unknown kind', () => {
    expect(plateParamsSchema.safeParse({ fasteners: { kind: 'nails' } }).success).toBe(false)
  })

  it('screws make no hole in either layer; bolts are drilled right through', () => {
    expect(build({}).fasteners.every((f) => !f.through)).toBe(true)
    expect(build({}).fasteners).toHaveLength(12)
    expect(build({ kind: 'bolt-tnut' }).fasteners.every((f) => f.through)).toBe(true)
    expect(build({ kind: 'bolt-counterbore' }).fasteners.every((f) => f.through)).toBe(true)
  })
})

describe('least wood round the fastener holes (against the pocket and the rabbet edge)', () => {
  // Default: pocket 4-1/4 in (r 2.125), rabbet 1/2 in wide (edge r 2.625), fasteners 1/4 in on the
  // middle of the ring (r 2.375): 2.375 - 0.125 - 2.125 = 1/8 in each side, exactly the least.
  it('passes the default: 1/8 in to the pocket and to the rabbet edge', () => {
    const list = codes({})
    expect(list).not.toContain('fastener-edge-wood')
    expect(list).not.toContain('fastener-off-rim')
  })

  it('flags 5/16 in fasteners: 2.375 - 0.15625 - 2.125 = 3/32 in of wood, under 1/8 in', () => {
    const f = finding({ diameter: (5 / 16) * IN }, 'fastener-edge-wood')
    expect(f).toBeDefined()
    expect(f!.values!.wood).toBeCloseTo((3 / 32) * IN, 6)
    expect(f!.field).toBe('rabbetWidth')
  })

  it('flags a bolt circle moved in to 4.6 in: 2.3 - 0.125 - 2.125 = 0.05 in to the pocket, and points at the circle', () => {
    const f = finding({ boltCircleDiameter: 4.6 * IN, edgeWood: 0.04 * IN }, 'fastener-edge-wood')
    expect(f).toBeUndefined()
    const g = finding({ boltCircleDiameter: 4.6 * IN }, 'fastener-edge-wood')
    expect(g!.values!.toPocket).toBeCloseTo(0.05 * IN, 6)
    expect(g!.values!.toEdge).toBeCloseTo(0.2 * IN, 6)
    // 0.05 + 0.2 = 0.25 in, room for 1/8 in each side: moving the circle mends it.
    expect(g!.field).toBe('fasteners.boltCircleDiameter')
  })

  it('keeps the off-rim error for a hole that breaks into the pocket (circle 4.4 in: 2.2 - 0.125 < 2.125)', () => {
    expect(codes({ boltCircleDiameter: 4.4 * IN })).toContain('fastener-off-rim')
  })
})

describe('what stands below the plate, against the floor gap', () => {
  it('default 3/4 in screws stay in the wood (1.031 in under the rim): nothing below', () => {
    const list = codes({})
    for (const c of ['fastener-through', 'fastener-below-plate', 'fastener-short']) expect(list).not.toContain(c)
  })

  it('1-1/8 in screws poke 0.094 in out: a warning; they still clear the floor by 0.25 in', () => {
    const f = finding({ length: 1.125 * IN }, 'fastener-through')
    expect(f!.values!.tip).toBeCloseTo((1.125 - FLOOR_WOOD) * IN, 6)
    // 0.344 - 0.094 = 0.250 in: just the least floor gap (0.2497... by hand, so a hair under).
    expect(FLOOR_GAP - (1.125 - FLOOR_WOOD)).toBeCloseTo(0.25, 2)
  })

  it('1-1/4 in screws leave 0.344 - 0.219 = 0.125 in to the floor: less than the 1/4 in least floor gap', () => {
    const f = finding({ length: 1.25 * IN }, 'fastener-below-plate')
    expect(f!.severity).toBe('warning')
    expect(f!.values!.projection).toBeCloseTo((1.25 - FLOOR_WOOD) * IN, 6)
    expect(f!.values!.clearance).toBeCloseTo((FLOOR_GAP - (1.25 - FLOOR_WOOD)) * IN, 3)
  })

  it('1-1/2 in screws stand 0.469 in below, more than the 0.344 in floor gap: they drag (an error)', () => {
    const f = finding({ length: 1.5 * IN }, 'fastener-below-plate')
    expect(f!.severity).toBe('error')
  })

  it('T-nuts: a 1 in bolt is short of the nut (1.031 in); 1-1/16 in reaches it and the 1/16 in flange leaves 0.281 in', () => {
    expect(codes({ kind: 'bolt-tnut', length: 1 * IN })).toContain('fastener-short')
    const ok = codes({ kind: 'bolt-tnut', length: (17 / 16) * IN })
    expect(ok).not.toContain('fastener-short')
    expect(ok).not.toContain('fastener-below-plate')
    // A 1/8 in flange proud of the underside: 0.344 - 0.125 = 0.219 in, under the 1/4 in least.
    const f = finding({ kind: 'bolt-tnut', length: (17 / 16) * IN, tnutFlange: 0.125 * IN }, 'fastener-below-plate')
    expect(f!.values!.projection).toBeCloseTo(0.125 * IN, 6)
  })

  it('counterbored nuts sit in the wood: a 3/4 in bolt reaches a nut 3/8 in up (1.031 - 0.375 = 0.656 in)', () => {
    const list = codes({ kind: 'bolt-counterbore', length: 0.75 * IN, counterboreDepth: 0.375 * IN })
    expect(list).not.toContain('fastener-short')
    expect(list).not.toContain('fastener-below-plate')
    expect(codes({ kind: 'bolt-counterbore', length: 0.625 * IN, counterboreDepth: 0.375 * IN })).toContain('fastener-short')
  })
})
