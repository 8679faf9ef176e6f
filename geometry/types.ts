// Public result types of the geometry library. Lengths in millimetres, angles
// in degrees counter-clockwise from +x, origin at the plate centre, y up.
// No paper.js types appear here: callers on the server, in the browser and in
// the exporters see plain data only.

export type Point = [number, number]

export type HoleKind = 'pocket' | 'access' | 'centre' | 'index'

/**
 * How a hole is made: small holes drilled, openings up to about 6 in cut with
 * a hole saw of that size, larger or odd-sized ones routed round a pattern
 * (common practice, from memory).
 */
export type HoleMethod = 'drill' | 'hole-saw' | 'routed'

/** A round through-hole in the plate. */
export interface Hole {
  /** Stable id within one plate, e.g. `pocket-0`, `access-2`, `centre`, `index-0`. */
  id: string
  kind: HoleKind
  x: number
  y: number
  diameter: number
  method: HoleMethod
  /** The hole saw's nominal diameter, mm, for `hole-saw` openings. */
  sawSize?: number
}

/** A fastener hole through the rabbet floor that holds a pan's rim down. */
export interface Fastener {
  /** `fastener-<pocket>-<k>`. */
  id: string
  pocketId: string
  x: number
  y: number
  diameter: number
  /** Drilled right through the plate (bolts); false for screws into the rabbet floor, which need no hole cut. */
  through: boolean
}

/** The stepped ring round a pocket where the pan's rim sits flush. */
export interface Rabbet {
  pocketId: string
  x: number
  y: number
  /** Outside diameter of the rabbet (pocket diameter + 2 * rabbet width). */
  diameter: number
  /** Depth below the top face of the plate. */
  depth: number
}

/** A caster's top (mounting) plate, turned square to the radial line. */
export interface CasterMount {
  pocketId: string
  /** Angle of the radial line through the pocket centre. */
  angle: number
  /** Rectangle corners, counter-clockwise. */
  corners: Point[]
  bolts: { x: number; y: number; diameter: number }[]
}

/** Where a pocket reaches under the trunk, the notch the tube needs. */
export interface TubeNotch {
  pocketId: string
  /** Centre angle of the notch round the tube. */
  angle: number
  startAngle: number
  endAngle: number
  /** Angular span in degrees. */
  span: number
  /** Width of the notch unrolled at the tube's outside circumference. */
  width: number
  /** Distance along the unrolled outside circumference from the clocking axis to the notch centre. */
  offsetAlongWrap: number
  /** How high the notch is cut at its highest, mm above the plate's top face: over a pan's body its rise plus a clearance, over a rim alone the rim's relief. */
  height: number
  /** Height over the stretch where only the rim lies under the wall, mm. */
  rimHeight: number
  /** The middle stretch where the pan's body lies under the wall (cut to `height`), centred on `angle`; null when only the rim does. */
  body: { span: number; width: number } | null
}

/** A lobe tip, for drawing handles and for per-lobe overrides. */
export interface LobeTip {
  index: number
  angle: number
  /** Distance from the plate centre to the tip. */
  radius: number
  x: number
  y: number
  /** The lobe's own reach beyond the valley line and width there, mm (irregularity and overrides applied). */
  reach: number
  width: number
}

export type Severity = 'error' | 'warning'

export interface Finding {
  code: string
  severity: Severity
  message: string
  /** The place it concerns, where there is one. */
  at?: { x: number; y: number; radius?: number }
  /** Ids of the holes it concerns. */
  holeIds?: string[]
  /** The parameter path most closely concerned, e.g. `casterOffset`. */
  field?: string
  /** The numbers behind the message (lengths in mm, angles in degrees, fractions 0-1), so a page can say it in the reader's units. */
  values?: Record<string, number>
}

export interface Metrics {
  /** Outline area minus through-holes, mm2. */
  area: number
  /** Outline perimeter, mm. */
  perimeter: number
  width: number
  height: number
  bounds: { minX: number; minY: number; maxX: number; maxY: number }
  /** Smallest circle enclosing the outline. */
  enclosingCircle: { x: number; y: number; radius: number }
  /** Total plate thickness (layers * sheet thickness), mm. */
  thickness: number
  /** Net wood volume: area * thickness less rabbets, mm3. */
  volume: number
  /** kg, from the plywood density. */
  weight: number
  /** kg/m3 and where the figure comes from. */
  density: { value: number; source: string }
  /** Gap between the floor and the underside of the plate, mm. */
  floorGap: number
  /** Share (0-1) of the tube's foot, the ring between its outside and inside diameters, that stands on wood. */
  tubeBearing: number
}

export interface Plate {
  /** The parsed parameters the plate was built from. */
  params: import('./params').PlateParams
  /** Outside profile as a polygon: counter-clockwise, first point not repeated, chord error <= 0.1 mm. */
  outline: Point[]
  /** The same outline as SVG path data with cubic curves, in plate coordinates (y up). */
  outlinePath: string
  holes: Hole[]
  /** Pan-rim fasteners, drilled through the rabbet floor. The caster's own bolts are not here: they go through the pan's steel (see casterMounts). */
  fasteners: Fastener[]
  trunk: { x: number; y: number; diameter: number; innerDiameter: number }
  rabbets: Rabbet[]
  /** Caster top plates and their bolts, for reference: the bolts go through the pan's crown, not the plywood. */
  casterMounts: CasterMount[]
  notches: TubeNotch[]
  lobeTips: LobeTip[]
  /** The clocking axis: the line through the centre and the index holes. */
  axis: { angle: number; from: Point; to: Point }
  findings: Finding[]
  metrics: Metrics
}
