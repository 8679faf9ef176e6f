// Independent checks of a nesting: nothing here comes from geometry/. Areas
// and perimeters by the shoelace formula and Pythagoras, overlaps by
// polygon-clipping (a general-purpose polygon engine, REFERENCES.md), gaps
// by brute-force segment distances, the peer by maxrects-packer (REFERENCES.md,
// "a peer for nesting").
import polygonClipping from 'polygon-clipping'
// The package's `main` is a UMD file under `"type": "module"`, which Node cannot load: take its ES build.
import { MaxRectsPacker } from 'maxrects-packer/dist/maxrects-packer.mjs'
import { shoelace } from '../geometry/helpers'

export type Pt = [number, number]

// Signed area by the shoelace formula, the same independent reading the geometry tests use.
export { shoelace }

export function perimeterOf(ring: Pt[]): number {
  let s = 0
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!
    const b = ring[(i + 1) % ring.length]!
    s += Math.hypot(b[0] - a[0], b[1] - a[1])
  }
  return s
}

/** Area of the overlap of two rings, by polygon-clipping and the shoelace formula. */
export function overlapArea(a: Pt[], b: Pt[]): number {
  const out = polygonClipping.intersection([a], [b])
  let area = 0
  for (const poly of out) {
    poly.forEach((ring, k) => {
      const r = ring.slice(0, -1) as Pt[]
      area += (k === 0 ? 1 : -1) * Math.abs(shoelace(r))
    })
  }
  return area
}

function segDist(p: Pt, q: Pt, r: Pt, s: Pt): number {
  const pointSeg = (a: Pt, b: Pt, c: Pt) => {
    const dx = c[0] - b[0]
    const dy = c[1] - b[1]
    const l = dx * dx + dy * dy
    const t = l === 0 ? 0 : Math.max(0, Math.min(1, ((a[0] - b[0]) * dx + (a[1] - b[1]) * dy) / l))
    return Math.hypot(a[0] - b[0] - t * dx, a[1] - b[1] - t * dy)
  }
  const cross = (o: Pt, a: Pt, b: Pt) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
  const d1 = cross(p, q, r)
  const d2 = cross(p, q, s)
  const d3 = cross(r, s, p)
  const d4 = cross(r, s, q)
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return 0
  return Math.min(pointSeg(p, r, s), pointSeg(q, r, s), pointSeg(r, p, q), pointSeg(s, p, q))
}

function box(r: Pt[]) {
  const xs = r.map((p) => p[0])
  const ys = r.map((p) => p[1])
  return { minX: Math.min(...xs), maxX: Math.max(...xs), minY: Math.min(...ys), maxY: Math.max(...ys) }
}

/** Least distance between two rings' edges (0 when they cross), by trying every pair of segments. */
export function gap(a: Pt[], b: Pt[], enough = Infinity): number {
  const ba = box(a)
  const bb = box(b)
  const apart = Math.max(bb.minX - ba.maxX, ba.minX - bb.maxX, bb.minY - ba.maxY, ba.minY - bb.maxY)
  if (apart > enough) return apart
  let best = Infinity
  for (let i = 0; i < a.length; i++) {
    const p = a[i]!
    const q = a[(i + 1) % a.length]!
    for (let j = 0; j < b.length; j++) {
      const d = segDist(p, q, b[j]!, b[(j + 1) % b.length]!)
      if (d < best) best = d
    }
  }
  return best
}

/** REFERENCES.md (added for the second round): ceil(total part area / usable sheet area). */
export function areaLowerBound(areas: number[], sheet: { width: number; height: number; margin: number }): number {
  const usable = (sheet.width - 2 * sheet.margin) * (sheet.height - 2 * sheet.margin)
  return Math.ceil(areas.reduce((s, a) => s + a, 0) / usable - 1e-9)
}

/** The peer: every part's bounding rectangle (plus the kerf) packed by maxrects-packer. */
export function peerSheets(
  rings: { outline: Pt[]; count: number }[],
  sheet: { width: number; height: number; margin: number; kerf: number },
  allowRotation = true,
): number {
  const packer = new MaxRectsPacker(sheet.width - 2 * sheet.margin + sheet.kerf, sheet.height - 2 * sheet.margin + sheet.kerf, 0, {
    smart: true,
    pot: false,
    square: false,
    allowRotation,
  })
  for (const r of rings) {
    const b = box(r.outline)
    for (let k = 0; k < r.count; k++) packer.add(b.maxX - b.minX + sheet.kerf, b.maxY - b.minY + sheet.kerf, {})
  }
  return packer.bins.length
}
