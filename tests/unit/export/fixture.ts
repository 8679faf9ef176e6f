// Hand-built plates for the exporter tests, independent of the geometry core:
// a circle or a lobed outline r(t) = R + A cos(n t), with a few holes, rabbets,
// caster mounts and tube notches placed by simple trigonometry. The numbers are
// our own invention.

import type { Plate, Point } from '../../../geometry/types'

export interface FixtureOptions {
  /** Base radius, mm. */
  radius?: number
  /** Lobe amplitude, mm (0 for a circle). */
  amplitude?: number
  lobes?: number
  /** Outline vertex count. */
  segments?: number
  tubeDiameter?: number
  casters?: number
  casterOffset?: number
  pocketDiameter?: number
  rabbetWidth?: number
  rabbetDepth?: number
  /** Add an outlinePath with cubic curves (true circle of `radius`, amplitude must be 0). */
  cubicCircle?: boolean
}

const rad = (deg: number) => (deg * Math.PI) / 180

export function shoelace(points: Point[]): number {
  let a = 0
  for (let i = 0; i < points.length; i++) {
    const [x0, y0] = points[i]!
    const [x1, y1] = points[(i + 1) % points.length]!
    a += x0 * y1 - x1 * y0
  }
  return a / 2
}

/** Shortest distance from a point to a closed polygon's edges. */
export function distanceToPolygon(p: Point, poly: Point[]): number {
  let best = Infinity
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i]!
    const b = poly[(i + 1) % poly.length]!
    const dx = b[0] - a[0]
    const dy = b[1] - a[1]
    const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy || 1)))
    best = Math.min(best, Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy))
  }
  return best
}

/** Four cubic quarter arcs, the usual kappa = 4/3 (sqrt 2 - 1). */
function cubicCirclePath(r: number): string {
  const k = (4 / 3) * (Math.SQRT2 - 1) * r
  return [
    `M ${r} 0`,
    `C ${r} ${k} ${k} ${r} 0 ${r}`,
    `C ${-k} ${r} ${-r} ${k} ${-r} 0`,
    `C ${-r} ${-k} ${-k} ${-r} 0 ${-r}`,
    `C ${k} ${-r} ${r} ${-k} ${r} 0`,
    'Z',
  ].join(' ')
}

export function fixturePlate(options: FixtureOptions = {}): Plate {
  const R = options.radius ?? 400
  const A = options.amplitude ?? 80
  const n = options.lobes ?? 3
  const segments = options.segments ?? 1440
  const tube = options.tubeDiameter ?? 305
  const casters = options.casters ?? 3
  const offset = options.casterOffset ?? 230
  const pocket = options.pocketDiameter ?? 127
  const rabbetWidth = options.rabbetWidth ?? 12.7
  const rabbetDepth = options.rabbetDepth ?? 9.525

  const outline: Point[] = []
  for (let i = 0; i < segments; i++) {
    const t = (2 * Math.PI * i) / segments
    const r = R + A * Math.cos(n * t)
    outline.push([r * Math.cos(t), r * Math.sin(t)])
  }
  const outlinePath =
    options.cubicCircle && A === 0
      ? cubicCirclePath(R)
      : `M ${outline.map(([x, y]) => `${x} ${y}`).join(' L ')} Z`

  const holes: Plate['holes'] = []
  const rabbets: Plate['rabbets'] = []
  const casterMounts: Plate['casterMounts'] = []
  const notches: Plate['notches'] = []
  const circumference = Math.PI * tube
  for (let i = 0; i < casters; i++) {
    const angle = (360 / casters) * i
    const x = offset * Math.cos(rad(angle))
    const y = offset * Math.sin(rad(angle))
    const id = `pocket-${i}`
    holes.push({ id, kind: 'pocket', x, y, diameter: pocket, method: 'routed' })
    rabbets.push({ pocketId: id, x, y, diameter: pocket + 2 * rabbetWidth, depth: rabbetDepth })
    // A 4 x 4.5 in top plate square to the radial line, bolts 3/8 in in from each corner.
    const hw = 57.15
    const hh = 50.8
    const ux = [Math.cos(rad(angle)), Math.sin(rad(angle))] as const
    const uy = [-ux[1], ux[0]] as const
    const corner = (a: number, b: number): Point => [x + a * ux[0] + b * uy[0], y + a * ux[1] + b * uy[1]]
    casterMounts.push({
      pocketId: id,
      angle,
      corners: [corner(-hh, -hw), corner(hh, -hw), corner(hh, hw), corner(-hh, hw)],
      bolts: [corner(-hh + 9.5, -hw + 9.5), corner(hh - 9.5, -hw + 9.5), corner(hh - 9.5, hw - 9.5), corner(-hh + 9.5, hw - 9.5)].map(
        ([bx, by]) => ({ x: bx, y: by, diameter: 7.9 }),
      ),
    })
    const span = 30
    notches.push({
      pocketId: id,
      angle,
      startAngle: angle - span / 2,
      endAngle: angle + span / 2,
      span,
      width: (circumference * span) / 360,
      offsetAlongWrap: (circumference * angle) / 360,
      height: 25.4,
      // One height across: the pan's body under the whole notch.
      rimHeight: 25.4,
      body: { span, width: (circumference * span) / 360 },
    })
  }
  for (let i = 0; i < casters; i++) {
    const angle = (360 / casters) * (i + 0.5)
    holes.push({
      id: `access-${i}`,
      kind: 'access',
      x: 80 * Math.cos(rad(angle)),
      y: 80 * Math.sin(rad(angle)),
      diameter: 76.2,
      method: 'routed',
    })
  }
  holes.push({ id: 'centre', kind: 'centre', x: 0, y: 0, diameter: 25.4, method: 'drill' })
  holes.push({ id: 'index-0', kind: 'index', x: R - A - 40, y: 0, diameter: 6.35, method: 'drill' })
  holes.push({ id: 'index-1', kind: 'index', x: -(R - A - 40), y: 0, diameter: 6.35, method: 'drill' })

  const area = Math.abs(shoelace(outline)) - holes.filter((h) => h.kind !== 'index').reduce((s, h) => s + (Math.PI * h.diameter ** 2) / 4, 0)
  const xs = outline.map((p) => p[0])
  const ys = outline.map((p) => p[1])
  const bounds = { minX: Math.min(...xs), minY: Math.min(...ys), maxX: Math.max(...xs), maxY: Math.max(...ys) }
  const reach = R + A

  return {
    params: {} as Plate['params'],
    outline,
    outlinePath,
    holes,
    fasteners: [],
    trunk: { x: 0, y: 0, diameter: tube, innerDiameter: tube - 12 },
    rabbets,
    casterMounts,
    notches,
    lobeTips: [],
    axis: { angle: 0, from: [-reach, 0], to: [reach, 0] },
    findings: [],
    metrics: {
      area,
      perimeter: 0,
      width: bounds.maxX - bounds.minX,
      height: bounds.maxY - bounds.minY,
      bounds,
      enclosingCircle: { x: 0, y: 0, radius: reach },
      thickness: 36,
      volume: 0,
      weight: 0,
      density: { value: 538, source: 'fixture' },
      floorGap: 10,
      tubeBearing: 1,
    },
  }
}
