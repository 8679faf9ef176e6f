// The SVG cut file, read back with an independent XML reader (happy-dom's
// DOMParser) and checked against the hand-built fixture's own numbers: a lobed
// outline r(t) = 400 + 80 cos 3t, three pockets of 127 mm at 230 mm, three
// access holes of 76.2 mm at 80 mm, a 25.4 mm centre hole, two 6.35 mm index
// holes at +-280 mm, rabbets 12.7 mm wide and 9.525 mm deep, a 305 mm tube.
import { Window } from 'happy-dom'
import { describe, expect, it } from 'vitest'
import { renderCutSvg } from '../../../geometry/export/svg'
import { fixturePlate, shoelace } from './fixture'
import type { Point } from '../../../geometry/types'

const plate = fixturePlate()
const rad = (deg: number) => (deg * Math.PI) / 180
// Extent along x of r(t) = 400 + 80 cos 3t, x = r cos t, sampled finely from the formula:
// 480 at t = 0, and about -346.4 near t = pi +- 0.55 (not at t = pi, where r is only 320).
const outlineWidth = (() => {
  let lo = Infinity
  let hi = -Infinity
  for (let i = 0; i < 200_000; i++) {
    const t = (2 * Math.PI * i) / 200_000
    const x = (400 + 80 * Math.cos(3 * t)) * Math.cos(t)
    lo = Math.min(lo, x)
    hi = Math.max(hi, x)
  }
  return hi - lo
})()

function read(svg: string) {
  const window = new Window()
  const doc = new window.DOMParser().parseFromString(svg, 'image/svg+xml')
  const root = doc.querySelector('svg')
  if (!root) throw new Error('no <svg> element')
  const groups = new Map<string, Element[]>()
  for (const g of doc.querySelectorAll('g')) groups.set(g.getAttribute('id') ?? '', [...g.children] as unknown as Element[])
  return { root: root as unknown as Element, groups }
}

const num = (el: Element, name: string) => Number(el.getAttribute(name))
const circles = (els: Element[] | undefined) => (els ?? []).filter(e => e.tagName.toLowerCase() === 'circle').map(e => ({ x: num(e, 'cx'), y: num(e, 'cy'), r: num(e, 'r') }))
const points = (el: Element): Point[] => el.getAttribute('points')!.trim().split(/\s+/).map(p => p.split(',').map(Number) as Point)

/** Sorted "x y r" strings, rounded to 0.01 mm, so two sets of circles compare as sets. */
const round = (v: number) => (Math.round(v * 100) / 100 + 0).toFixed(2)
const key = (cs: { x: number; y: number; r: number }[]) => cs.map(c => `${round(c.x)} ${round(c.y)} ${round(c.r)}`).sort()
/** SVG y runs down (SVG 1.1, 7.3): a plate point (x, y) is drawn at (x, -y). */
const onPaper = (x: number, y: number, r: number) => ({ x: x + 0, y: -y + 0, r })

describe('renderCutSvg, read back by an XML parser', () => {
  it('is drawn at real size: width and height in inches or millimetres matching the viewBox (SVG 1.1, 7.2 and 7.7)', () => {
    for (const units of ['in', 'mm'] as const) {
      const { root } = read(renderCutSvg(plate, { units, includeReference: false }))
      const width = root.getAttribute('width')!
      const height = root.getAttribute('height')!
      expect(width.endsWith(units)).toBe(true)
      expect(height.endsWith(units)).toBe(true)
      const [, , vw, vh] = root.getAttribute('viewBox')!.split(' ').map(Number)
      expect(Number.parseFloat(width)).toBeCloseTo(vw!, 4)
      expect(Number.parseFloat(height)).toBeCloseTo(vh!, 4)
      // The outline's own extent plus a border of a few millimetres for the stroke. 1 in = 25.4 mm (NIST SP 811).
      const across = units === 'in' ? vw! * 25.4 : vw!
      expect(across).toBeGreaterThan(outlineWidth)
      expect(across).toBeLessThan(outlineWidth + 10)
    }
  })

  it('the outside layer is the lobed outline itself: every point on r = 400 + 80 cos 3t, area pi (R^2 + A^2 / 2)', () => {
    const { groups } = read(renderCutSvg(plate, { units: 'mm' }))
    const outside = groups.get('RP-OUTSIDE-CUT')!
    expect(outside.map(e => e.tagName.toLowerCase())).toEqual(['polygon'])
    const pts = points(outside[0]!).map(([x, y]) => [x, -y] as Point)
    expect(pts.length).toBeGreaterThan(100)
    for (const [x, y] of pts) {
      const t = Math.atan2(y, x)
      expect(Math.abs(Math.hypot(x, y) - (400 + 80 * Math.cos(3 * t)))).toBeLessThan(0.05)
    }
    // Area of a polar curve, 1/2 integral of r^2 dt, over a full turn: pi (R^2 + A^2 / 2) = 512,707.92 mm2.
    expect(Math.abs(shoelace(pts)) / (Math.PI * (400 ** 2 + 80 ** 2 / 2))).toBeCloseTo(1, 4)
  })

  it('puts each hole on its operation\'s layer, where the fixture placed it (one layer per operation, common CNC practice)', () => {
    const { groups } = read(renderCutSvg(plate, { units: 'mm' }))
    const inside = [
      ...[0, 120, 240].map(a => onPaper(230 * Math.cos(rad(a)), 230 * Math.sin(rad(a)), 63.5)),
      ...[60, 180, 300].map(a => onPaper(80 * Math.cos(rad(a)), 80 * Math.sin(rad(a)), 38.1)),
    ]
    expect(key(circles(groups.get('RP-INSIDE-CUT')))).toEqual(key(inside))
    // The rabbet layer is named by its depth, 9.525 mm, and rings each pocket 12.7 mm wider all round.
    const rabbet = [0, 120, 240].map(a => onPaper(230 * Math.cos(rad(a)), 230 * Math.sin(rad(a)), 63.5 + 12.7))
    expect(key(circles(groups.get('RP-RABBET-9.525MM')))).toEqual(key(rabbet))
    // Drilled through the wood: the 1 in centre hole and the two index holes (the fixture has no
    // rim fasteners). The caster bolts go through the pan's steel, so they are reference only.
    const drill = circles(groups.get('RP-DRILL'))
    expect(key(drill)).toEqual(key([onPaper(0, 0, 12.7), onPaper(280, 0, 3.175), onPaper(-280, 0, 3.175)]))
    // Reference: the tube (305 mm), four bolts on each of three caster plates, the clocking axis
    // along x, and three caster plate outlines.
    const reference = groups.get('RP-REFERENCE')!
    const refCircles = circles(reference)
    expect(refCircles.filter(c => Math.abs(c.r - 152.5) < 1e-6)).toHaveLength(1)
    expect(refCircles).toHaveLength(1 + 3 * 4)
    expect(reference.filter(e => e.tagName.toLowerCase() === 'polygon')).toHaveLength(3)
    const noRef = read(renderCutSvg(plate, { units: 'mm', includeReference: false })).groups
    expect(noRef.has('RP-REFERENCE')).toBe(false)
    expect(noRef.has('RP-OUTSIDE-CUT')).toBe(true)
  })

  it('turns y so the drawing is not upside down', () => {
    // A hole above the centre (plate y > 0) must sit above it in SVG, i.e. at a negative cy.
    const above = { ...plate, holes: [{ id: 'access-x', kind: 'access' as const, x: 0, y: 100, diameter: 50, method: 'routed' as const }] }
    const { groups } = read(renderCutSvg(above, { units: 'mm' }))
    expect(circles(groups.get('RP-INSIDE-CUT'))).toEqual([{ x: 0, y: -100, r: 25 }])
  })

  it('in inches every length is divided by 25.4 (NIST SP 811)', () => {
    const { groups } = read(renderCutSvg(plate, { units: 'in' }))
    const centre = circles(groups.get('RP-DRILL')).find(c => Math.abs(c.x) < 1e-9 && Math.abs(c.y) < 1e-9)
    expect(centre?.r).toBeCloseTo(0.5, 4)
    expect(Math.max(...circles(groups.get('RP-REFERENCE')).map(c => c.r))).toBeCloseTo(152.5 / 25.4, 4)
  })
})
