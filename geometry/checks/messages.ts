// The words of the checks, built when they are shown: the geometry hands over
// a code and numbers (mm), and the page, PDF or cut file says them in the
// reader's units. Findings of one kind about one kind of hole are one row (six
// pockets running into their neighbours is one mistake, not six), and a row
// names the field to change with a value that clears it where one can be
// worked out and checked.

import type { PlateParams, ParamIssue } from '../params'
import type { Finding, Hole, HoleKind, Plate } from '../types'
import { formatLength, MM_PER_INCH } from '../units'
import { placeAccess, placeCasters } from '../features/placement'
import { HOLE_SAW_INCHES } from '../features/holes'
import { buildPlate } from '../plate'
import { formatMass } from '../stability/format'

export interface MessageUnits {
  units: 'in' | 'mm'
  /** Fraction of an inch figures are rounded to. Default 16. */
  denominator?: 2 | 4 | 8 | 16 | 32 | 64
}

/** A length in the reader's units: inches with fractions, or millimetres. */
export function lengthText(mm: number, u: MessageUnits): string {
  return formatLength(mm, u.units, { denominator: u.denominator ?? 16 })
}

/** The step a suggested value is rounded to, mm: one fraction of an inch, or half a millimetre. */
function step(u: MessageUnits): number {
  return u.units === 'in' ? MM_PER_INCH / (u.denominator ?? 16) : 0.5
}

/** The labels of the fields a problem can send the reader to, as the parameter panel names them. */
export const FIELD_LABELS: Record<string, string> = {
  tubeDiameter: 'Tube diameter',
  tubeWall: 'Tube wall',
  casterCount: 'Casters',
  casterOffset: 'Caster offset',
  pocketDiameter: 'Pocket diameter',
  rabbetWidth: 'Rabbet width',
  rabbetDepth: 'Rabbet depth',
  panDepth: 'Pan depth',
  'caster.wheelDiameter': 'Wheel diameter',
  'caster.swivelLead': 'Swivel lead',
  'caster.overallHeight': 'Caster height',
  'caster.boltSpacingX': 'Bolt spacing, long',
  'caster.boltSpacingY': 'Bolt spacing, short',
  'caster.racewayDiameter': 'Swivel raceway',
  'fasteners.boltCircleDiameter': 'Bolt circle',
  'fasteners.length': 'Fastener length',
  'lobes.reach': 'Reach',
  'lobes.width': 'Width',
  'lobes.valley': 'Valley',
  'lobes.roundness': 'Roundness',
  'access.diameter': 'Opening diameter',
  'access.offset': 'Opening offset',
  centreHoleDiameter: 'Centre hole',
  indexHoleDiameter: 'Index holes',
  'cutting.bitDiameter': 'Router bit',
  minWood: 'Minimum wood',
  'access.enabled': 'Access openings',
  'unit.casterRating': 'Caster rating, each',
  'unit.counterweight.count': 'Blocks',
  'unit.load.height': 'Centre of mass height',
}

const KIND_ONE: Record<HoleKind, string> = { pocket: 'pocket', access: 'access opening', centre: 'centre hole', index: 'index hole' }
const KIND_MANY: Record<HoleKind, string> = { pocket: 'pockets', access: 'access openings', centre: 'centre hole', index: 'index holes' }
const KIND_ORDER: HoleKind[] = ['pocket', 'access', 'centre', 'index']

function kindOf(id: string): HoleKind {
  const k = id.split('-')[0]
  return k === 'pocket' || k === 'access' || k === 'index' ? k : 'centre'
}

function numberOf(id: string): number {
  return Number(id.split('-')[1] ?? 0) + 1
}

function capital(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1)
}

/** `1-3, 5`: hole numbers with runs joined. */
export function numberList(numbers: readonly number[]): string {
  const sorted = [...new Set(numbers)].sort((a, b) => a - b)
  const parts: string[] = []
  for (let i = 0; i < sorted.length; i++) {
    let j = i
    while (j + 1 < sorted.length && sorted[j + 1] === sorted[j]! + 1) j++
    parts.push(j - i >= 2 ? `${sorted[i]}-${sorted[j]}` : j === i ? `${sorted[i]}` : `${sorted[i]}, ${sorted[j]}`)
    i = j
  }
  return parts.join(', ')
}

/** `pocket 2`, `pockets 1-6`, `the centre hole`. */
function holesText(ids: readonly string[], kind: HoleKind): string {
  if (kind === 'centre') return 'the centre hole'
  const nums = ids.filter((id) => kindOf(id) === kind).map(numberOf)
  const distinct = new Set(nums).size
  return `${distinct === 1 ? KIND_ONE[kind] : KIND_MANY[kind]} ${numberList(nums)}`
}

/** What a row tells the reader to change: the field, and a value that clears the problem where one was found. */
export interface ProblemFix {
  field: string
  label: string
  /** `at least` / `at most` and the value (mm), when one was worked out and checked. */
  bound?: 'at least' | 'at most'
  value?: number
}

export interface ProblemRow {
  /** Stable within one plate: the code and the kinds of hole it concerns. */
  key: string
  code: string
  severity: 'error' | 'warning'
  /** Indices into `plate.findings` of every finding the row stands for. */
  indices: number[]
  text: string
  fix?: ProblemFix
}

interface Group {
  key: string
  code: string
  kinds: HoleKind[]
  findings: { f: Finding; i: number }[]
}

const PAIR_CODES = new Set(['holes-overlap', 'holes-too-close'])
const HOLE_CODES = new Set(['hole-cuts-edge', 'edge-too-close', 'access-outside-trunk', 'hole-crosses-trunk-wall', 'bolt-in-raceway'])

function groupKey(f: Finding): { key: string; kinds: HoleKind[] } {
  const ids = f.holeIds ?? []
  if (PAIR_CODES.has(f.code) || HOLE_CODES.has(f.code)) {
    const kinds = [...new Set(ids.map(kindOf))].sort((a, b) => KIND_ORDER.indexOf(a) - KIND_ORDER.indexOf(b))
    return { key: `${f.code}:${kinds.join('+')}`, kinds }
  }
  return { key: f.code, kinds: [...new Set(ids.map(kindOf))] }
}

function groups(findings: readonly Finding[]): Group[] {
  const out = new Map<string, Group>()
  findings.forEach((f, i) => {
    const { key, kinds } = groupKey(f)
    const g = out.get(key) ?? { key, code: f.code, kinds, findings: [] }
    g.findings.push({ f, i })
    out.set(key, g)
  })
  // Errors first, then in the order the geometry found them.
  return [...out.values()].sort((a, b) => sev(a) - sev(b) || a.findings[0]!.i - b.findings[0]!.i)
}

function sev(g: Group): number {
  return g.findings.some(({ f }) => f.severity === 'error') ? 0 : 1
}

const max = (g: Group, name: string) => Math.max(...g.findings.map(({ f }) => f.values?.[name] ?? -Infinity))
const min = (g: Group, name: string) => Math.min(...g.findings.map(({ f }) => f.values?.[name] ?? Infinity))
const first = (g: Group, name: string) => g.findings[0]!.f.values?.[name] ?? NaN
const pct = (v: number) => `${Math.round(v * 100)} %`

/** The sentence for a group of findings of one kind. */
function groupText(g: Group, u: MessageUnits): string {
  const L = (mm: number) => lengthText(mm, u)
  const ids = g.findings.flatMap(({ f }) => f.holeIds ?? [])
  const n = g.findings.length
  const places = n > 1 ? ` (${n} places)` : ''
  const who = () => {
    const [a, b] = g.kinds
    if (!a) return 'Holes'
    if (!b) return capital(holesText(ids, a))
    return `${capital(holesText(ids, a))} and ${holesText(ids, b)}`
  }
  switch (g.code) {
    case 'holes-overlap': {
      const verb = g.kinds.length === 1 && n > 1 ? 'run into their neighbours' : 'run into each other'
      return `${who()} ${verb}${places}, overlapping by up to ${L(max(g, 'overlap'))}.`
    }
    case 'holes-too-close':
      return `${who()} have as little as ${L(min(g, 'wood'))} of wood between them${places}, less than the minimum ${L(first(g, 'minWood'))}.`
    case 'hole-cuts-edge':
      return `${who()} ${n > 1 ? 'cut' : 'cuts'} through the plate's edge.`
    case 'edge-too-close':
      return `${who()} ${n > 1 ? 'have' : 'has'} as little as ${L(min(g, 'wood'))} of wood to the edge, less than the minimum ${L(first(g, 'minWood'))}.`
    case 'access-outside-trunk':
      return `${who()} ${n > 1 ? 'lie' : 'lies'} outside the trunk, where ${n > 1 ? 'they show' : 'it shows'} and cannot be reached from inside.`
    case 'hole-crosses-trunk-wall':
      return `${who()} ${n > 1 ? 'reach' : 'reaches'} under the tube wall (to ${L(max(g, 'reach'))} from the centre, the wall's inside is at ${L(first(g, 'insideRadius'))}), which would stand on nothing there.`
    case 'access-no-room':
      return `No access opening fits between the pans inside the tube wall, not even a ${L(first(g, 'smallestSaw'))} hole saw: the plate has none, so the pan fasteners cannot be reached from inside the trunk and any counterweight goes in before the tube is fixed.`
    case 'caster-too-big-for-pocket':
      return `The caster's top plate (${L(first(g, 'diagonal'))} corner to corner) cannot pass through a ${L(first(g, 'pocketDiameter'))} pocket to reach the pan.`
    case 'wheel-swing':
      return `The swivelling wheel needs ${L(first(g, 'swivelRadius'))} round its kingpin (its tread's reach plus the ${L(first(g, 'clearance'))} clearance), past the pocket's edge at ${L(first(g, 'pocketRadius'))}.`
    case 'bolt-in-raceway':
      return `${who()}: mounting bolts fall inside the swivel raceway (${L(first(g, 'racewayDiameter'))} across).`
    case 'floor-gap-negative':
      return `The plate would sit ${L(-first(g, 'floorGap'))} below the wheels' reach: it rests on the floor and the casters carry nothing.`
    case 'floor-gap-small':
      return `Floor gap ${L(first(g, 'floorGap'))} is less than the ${L(first(g, 'minFloorGap'))} asked for.`
    case 'pan-visible': {
      const hidden = first(g, 'hiddenMax') >= first(g, 'least')
      const all = g.findings[0]!.f.holeIds?.length
      return `${all && all > 1 ? 'Pans and rabbets show' : 'A pan and rabbet shows'} up to ${L(first(g, 'showing'))} outside the trunk's outside wall.${hidden ? '' : ` This tube is too slim to hide them: pans this size need at least ${L(first(g, 'least'))} of caster offset to clear the centre hole and each other. Smaller pans, fewer casters or a larger tube would hide them.`}`
    }
    case 'tube-bearing':
      return `Only ${pct(first(g, 'bearing'))} of the tube's foot stands on wood: the notches over the pans take ${Math.round(first(g, 'notchedAngle'))}° of it. Tuck the pans further in, use smaller pans or fewer casters.`
    case 'rabbet-floor-thin':
      return `The rabbet leaves ${L(first(g, 'wood'))} of plywood under the pan's rim, less than ${L(first(g, 'least'))}: too little for the rim's fasteners to bite and to carry the caster.`
    case 'fastener-off-rim':
      return `The pan-rim fasteners on a ${L(first(g, 'boltCircleDiameter'))} circle do not land in the rabbet floor between the pocket (${L(first(g, 'pocketDiameter'))}) and the rabbet's edge (${L(first(g, 'rabbetDiameter'))}).`
    case 'fastener-edge-wood':
      return `The pan-rim fastener holes leave ${L(first(g, 'wood'))} of wood to the pocket's or the rabbet's edge, less than the ${L(first(g, 'least'))} least wood for fasteners: the wood splits out.`
    case 'fastener-through':
      return `The pan screws' tips come ${L(first(g, 'tip'))} out of the plate's underside (${L(first(g, 'floor'))} of wood under the rim).`
    case 'fastener-short':
      return `The pan bolts reach ${L(first(g, 'length'))} below the rim, short of the ${L(first(g, 'needed'))} to their nut.`
    case 'fastener-below-plate':
      return `The pan fasteners stand ${L(first(g, 'projection'))} below the plate, leaving ${L(Math.max(0, first(g, 'clearance')))} to the floor (floor gap ${L(first(g, 'floorGap'))}, least ${L(first(g, 'minFloorGap'))}).`
    case 'inside-radius':
      return `${n > 1 ? `${n} inside bends of the outline are` : 'An inside bend of the outline is'} tighter than the ${L(first(g, 'bitDiameter'))} router bit can follow (down to a ${L(min(g, 'radius'))} radius; it leaves ${L(first(g, 'cutterRadius'))}).`
    case 'root-tip-sharp':
      return `${n > 1 ? `${n} roots end` : 'A root ends'} in a radius as small as ${L(min(g, 'radius'))}, sharper than the ${L(first(g, 'least'))} least tip: a sharper tip splinters.`
    case 'root-narrow':
      return `${n > 1 ? `${n} roots are` : 'A root is'} as narrow as ${L(min(g, 'width'))} halfway out, less than the ${L(first(g, 'least'))} least root width: plywood that narrow snaps across the grain.`
    case 'larger-than-sheet':
      return `The plate does not fit a ${L(first(g, 'sheetWidth'))} x ${L(first(g, 'sheetLength'))} sheet in any orientation, keeping ${L(first(g, 'edgeMargin'))} clear at the sheet's edges: each layer must be pieced.`
    case 'unit-tips':
      return `The centre of mass stands ${L(-first(g, 'supportDistance'))} outside the wheels' support (every wheel swivelled the worst way): the unit leaves its wheels on its own. Move the casters out or add counterweight.`
    case 'caster-overload': {
      const M = (kg: number) => formatMass(kg, u.units)
      return `The worst-loaded caster may carry ${M(first(g, 'loadPerCaster'))} when the plate stands on three of its wheels (an uneven floor; the even share is ${M(first(g, 'evenShare'))}), more than its rating of ${M(first(g, 'rating'))}. Use casters rated higher, or more of them.`
    }
    case 'counterweight-passage':
      if (Number.isFinite(first(g, 'passage')) && first(g, 'opening') > 0) return `A counterweight block needs an opening wider than ${L(first(g, 'passage'))} (the diagonal of its smallest end) to go in and come out again; the access openings are ${L(first(g, 'opening'))}.`
      return g.findings[0]!.f.message
    case 'counterweight-fit':
      if (Number.isFinite(first(g, 'capacity')) && Number.isFinite(first(g, 'count'))) return `Only ${first(g, 'capacity')} counterweight blocks fit inside the tube, clear of the pans and openings; ${first(g, 'count')} are loaded.`
      return g.findings[0]!.f.message
    default:
      // A code this list does not know yet: the geometry's own sentence, rather than nothing.
      return g.findings[0]!.f.message
  }
}

function holesOf(plate: Pick<Plate, 'holes'>, ids: readonly string[]): Hole[] {
  return ids.map((id) => plate.holes.find((h) => h.id === id)).filter((h): h is Hole => !!h)
}

function largestSawAtMost(mm: number): number | null {
  let best: number | null = null
  for (const inches of HOLE_SAW_INCHES) if (inches * MM_PER_INCH <= mm + 1e-9) best = inches * MM_PER_INCH
  return best
}

/** A candidate change (field, bound, value in mm) for a group, before it is checked. */
function candidate(g: Group, plate: Pick<Plate, 'params' | 'holes'>, u: MessageUnits): ProblemFix | null {
  const p = plate.params
  const s = step(u)
  const up = (v: number) => Math.ceil(v / s - 1e-9) * s
  const down = (v: number) => Math.floor(v / s + 1e-9) * s
  const field = g.findings[0]!.f.field ?? ''
  const fix = (f: string, bound?: 'at least' | 'at most', value?: number): ProblemFix => ({ field: f, label: FIELD_LABELS[f] ?? f, ...(bound && value !== undefined ? { bound, value } : {}) })
  const pair = g.kinds.join('+')
  switch (g.code) {
    case 'holes-overlap':
    case 'holes-too-close': {
      if (pair === 'pocket') return fix('casterOffset', 'at least', up(placeCasters(p).least))
      if (pair === 'pocket+centre') return fix('casterOffset', 'at least', up(p.pocketDiameter / 2 + p.rabbetWidth + p.minWood + p.centreHoleDiameter / 2))
      if (pair === 'pocket+access' || pair === 'access') {
        // Another offset for openings this size first; failing that, the largest opening the present spacing takes.
        const offset = placeAccess(p, p.casterOffset, p.access.diameter)
        if (offset !== null && Math.abs(offset - p.access.offset) > 0.25) return fix('access.offset', 'at most', offset)
        let most = Infinity
        for (const { f } of g.findings) {
          const [a, b] = holesOf(plate, f.holeIds ?? [])
          if (!a || !b) continue
          const d = Math.hypot(a.x - b.x, a.y - b.y)
          const other = a.kind === 'access' ? b : a
          const otherRadius = other.kind === 'pocket' ? other.diameter / 2 + p.rabbetWidth : other.diameter / 2
          most = Math.min(most, other.kind === 'access' ? d - p.minWood : 2 * (d - otherRadius - p.minWood))
        }
        const value = p.access.snapToHoleSaw ? largestSawAtMost(most) : down(most)
        return value !== null && value >= MM_PER_INCH * 0.75 ? fix('access.diameter', 'at most', value) : fix('access.diameter')
      }
      if (g.kinds.includes('index')) return fix('indexHoleDiameter')
      if (g.kinds.includes('centre')) return fix('centreHoleDiameter')
      return field ? fix(field) : null
    }
    case 'hole-cuts-edge':
    case 'edge-too-close': {
      // A hole through the edge has no wood figure: its own radius is a fair first try at what is missing.
      const wood = g.code === 'hole-cuts-edge' ? -Math.max(...g.findings.map(({ f }) => (f.at?.radius ?? 0))) : min(g, 'wood')
      return fix('lobes.valley', 'at least', up(Math.min(300, p.lobes.valley + (p.minWood - wood))))
    }
    case 'hole-crosses-trunk-wall':
      if (g.kinds.includes('access')) return fix('access.offset', 'at most', down(p.tubeDiameter / 2 - p.tubeWall - p.access.diameter / 2 - 1))
      return fix('centreHoleDiameter')
    case 'caster-too-big-for-pocket':
      return fix('pocketDiameter', 'at least', up(first(g, 'diagonal') + 0.01))
    case 'wheel-swing':
      return fix('pocketDiameter', 'at least', up(2 * first(g, 'swivelRadius')))
    case 'floor-gap-negative':
    case 'floor-gap-small': {
      const value = down(p.panDepth + first(g, 'floorGap') - p.minFloorGap)
      return value >= 0 ? fix('panDepth', 'at most', value) : fix('panDepth')
    }
    case 'pan-visible': {
      const hiddenMax = first(g, 'hiddenMax')
      return hiddenMax >= first(g, 'least') ? fix('casterOffset', 'at most', down(hiddenMax)) : fix('tubeDiameter')
    }
    case 'rabbet-floor-thin': {
      const value = down(p.layers * p.sheetThickness - first(g, 'least'))
      return value >= 1 ? fix('rabbetDepth', 'at most', value) : fix('rabbetDepth')
    }
    case 'inside-radius': {
      const value = down(2 * min(g, 'radius'))
      return value >= MM_PER_INCH / 16 ? fix('cutting.bitDiameter', 'at most', value) : fix('cutting.bitDiameter')
    }
    default:
      return field ? fix(field) : null
  }
}

function setPath(target: Record<string, unknown>, path: string, value: number): void {
  const keys = path.split('.')
  let at: Record<string, unknown> = target
  for (const k of keys.slice(0, -1)) at = at[k] as Record<string, unknown>
  at[keys.at(-1)!] = value
}

/**
 * Whether the change clears the group: the plate rebuilt with it no longer
 * has a finding with the group's key. A value that is shown has been tried.
 */
function clears(g: Group, params: PlateParams, fix: ProblemFix): boolean {
  if (fix.value === undefined) return false
  // A JSON copy, not structuredClone: in the browser the params may arrive wrapped in a reactive proxy, which structuredClone refuses.
  const next = JSON.parse(JSON.stringify(params)) as Record<string, unknown>
  setPath(next, fix.field, fix.value)
  try {
    const rebuilt = buildPlate(next as unknown as PlateParams)
    return !rebuilt.findings.some((f) => groupKey(f).key === g.key)
  } catch {
    return false
  }
}

export interface ProblemRowOptions extends MessageUnits {
  /** Work out and check a value for each row's field (one plate rebuild per row). Default true. */
  suggest?: boolean
}

/** One row per problem: findings grouped by kind, errors first, in the reader's units. */
export function problemRows(plate: Pick<Plate, 'params' | 'holes' | 'findings'>, options: ProblemRowOptions): ProblemRow[] {
  return groups(plate.findings).map((g) => {
    const severity = sev(g) === 0 ? 'error' : 'warning'
    const row: ProblemRow = { key: g.key, code: g.code, severity, indices: g.findings.map(({ i }) => i), text: groupText(g, options) }
    const fix = candidate(g, plate, options)
    if (fix) {
      const checked = fix.value !== undefined && options.suggest !== false && clears(g, plate.params, fix)
      row.fix = checked ? fix : { field: fix.field, label: fix.label }
    }
    return row
  })
}

/** `Caster offset: use at least 6"`, or `Change Caster offset` when no single value was found. */
export function fixText(fix: ProblemFix, u: MessageUnits): string {
  return fix.bound && fix.value !== undefined ? `${fix.label}: use ${fix.bound} ${lengthText(fix.value, u)}` : `Change ${fix.label}`
}

/** Counts a summary states: the same rows the list shows. */
export function problemCounts(rows: readonly ProblemRow[]): { errors: number; warnings: number } {
  return { errors: rows.filter((r) => r.severity === 'error').length, warnings: rows.filter((r) => r.severity === 'warning').length }
}

/**
 * A field message in the reader's units (or through the page's own length
 * formatter). `isLength` says whether the field holds a length, so a bound on
 * it is a length too; other bounds are plain numbers.
 */
export function paramIssueText(issue: Pick<ParamIssue, 'code' | 'values' | 'message'>, u: MessageUnits | ((mm: number) => string), isLength = true): string {
  const L = typeof u === 'function' ? u : (mm: number) => lengthText(mm, u)
  const v = issue.values ?? {}
  const n = (name: string) => v[name] ?? NaN
  const amount = (x: number) => (isLength ? L(x) : String(Number(x.toFixed(4))))
  switch (issue.code) {
    case 'too_small': return `Must be at least ${amount(n('minimum'))}.`
    case 'too_big': return `Must be at most ${amount(n('maximum'))}.`
    case 'tube-wall-fills-tube': return `A ${L(n('tubeWall'))} wall leaves no inside for a ${L(n('tubeDiameter'))} tube.`
    case 'rabbet-too-deep': return `Must be less than the plate thickness, ${L(n('thickness'))}.`
    case 'caster-offset-small': return `Too small for the pocket and its rabbet to clear the centre hole by the minimum wood: use at least ${L(n('least'))}.`
    case 'caster-shorter-than-wheel': return `Must be more than the wheel diameter, ${L(n('wheelDiameter'))}.`
    case 'swivel-lead-long': return `Should be less than the wheel diameter, ${L(n('wheelDiameter'))}.`
    case 'bolts-too-long': return `Does not fit on a top plate ${L(n('plate'))} long: use at most ${L(n('most'))}.`
    case 'bolts-too-wide': return `Does not fit on a top plate ${L(n('plate'))} wide: use at most ${L(n('most'))}.`
    case 'raceway-too-big': return `Larger than the top plate: use at most ${L(n('most'))}.`
    case 'no-such-lobe': return `There is no lobe ${n('lobe')}: the plate has ${n('count')} lobes.`
    case 'lobe-twice': return `Lobe ${n('lobe')} is changed twice.`
    case 'invalid_type': return 'Enter a number.'
    default: return issue.message
  }
}
