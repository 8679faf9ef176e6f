// The parameter panel's fields: where each value lives in the params, how it
// is entered, and which group it belongs to. Bounds and messages come from
// the geometry schema itself.
export type FieldKind = 'length' | 'count' | 'angle' | 'ratio' | 'toggle' | 'seed' | 'choice'

export interface ParamField {
  path: string
  label: string
  kind: FieldKind
  hint?: string
  /** A choice field's values and the words shown for them. */
  options?: { value: string; label: string }[]
  /** Shown only while this holds for the params (a field that applies to one fastener kind, say). */
  showIf?: (params: unknown) => boolean
}

const fastenerKindIs = (...kinds: string[]) => (params: unknown) => kinds.includes(String(getPath(params, 'fasteners.kind') ?? 'screw'))

export interface ParamGroup {
  id: string
  title: string
  fields: ParamField[]
}

export const paramGroups: ParamGroup[] = [
  {
    id: 'trunk',
    title: 'Trunk',
    fields: [
      { path: 'tubeDiameter', label: 'Tube diameter', kind: 'length', hint: 'Measured outside diameter of the form tube' },
      { path: 'tubeWall', label: 'Tube wall', kind: 'length' },
    ],
  },
  {
    id: 'casters',
    title: 'Casters',
    fields: [
      { path: 'casterCount', label: 'Casters', kind: 'count' },
      { path: 'casterOffset', label: 'Caster offset', kind: 'length', hint: 'Plate centre to pocket centre' },
      { path: 'panTuck', label: 'Pan tuck', kind: 'length', hint: 'How far inside the tube\'s outside face the pans\' rims are kept, for a tube that is not quite round' },
      { path: 'rotation', label: 'Rotation', kind: 'angle', hint: 'Angle of the first caster and the index holes' },
      { path: 'pocketDiameter', label: 'Pocket diameter', kind: 'length' },
      { path: 'rabbetWidth', label: 'Rabbet width', kind: 'length' },
      { path: 'rabbetDepth', label: 'Rabbet depth', kind: 'length' },
      { path: 'panDepth', label: 'Pan depth', kind: 'length' },
      { path: 'caster.wheelDiameter', label: 'Wheel diameter', kind: 'length', hint: 'Default 2 in, a typical small scenery caster (from memory): measure yours' },
      { path: 'caster.swivelLead', label: 'Swivel lead', kind: 'length', hint: 'Kingpin to axle; default 3/4 in (from memory): measure yours' },
      { path: 'caster.treadWidth', label: 'Tread width', kind: 'length', hint: 'Width of the wheel: its edges sweep the widest circle as it swivels' },
      { path: 'caster.swivelClearance', label: 'Swivel clearance', kind: 'length', hint: 'Room kept between the swivelling wheel and the pocket wall' },
      { path: 'caster.overallHeight', label: 'Caster height', kind: 'length', hint: 'Floor to the top of the mounting plate; default 2-5/8 in (from memory): measure yours' },
      { path: 'caster.topPlateWidth', label: 'Top plate width', kind: 'length', hint: 'Default 2-1/4 in (from memory): measure yours' },
      { path: 'caster.topPlateLength', label: 'Top plate length', kind: 'length', hint: 'Default 3 in (from memory): measure yours' },
      { path: 'caster.boltSpacingX', label: 'Bolt spacing, long', kind: 'length' },
      { path: 'caster.boltSpacingY', label: 'Bolt spacing, short', kind: 'length' },
      { path: 'caster.boltDiameter', label: 'Bolt diameter', kind: 'length' },
      { path: 'caster.racewayDiameter', label: 'Swivel raceway', kind: 'length' },
    ],
  },
  {
    id: 'fasteners',
    title: 'Pan fasteners',
    fields: [
      {
        path: 'fasteners.kind', label: 'Fastener kind', kind: 'choice', hint: 'Screws stay in the wood; bolts go right through the bottom layer',
        options: [
          { value: 'screw', label: 'wood screws into the rabbet floor' },
          { value: 'bolt-tnut', label: 'through-bolts with T-nuts' },
          { value: 'bolt-counterbore', label: 'through-bolts, nut in a counterbore' },
        ],
      },
      { path: 'fasteners.count', label: 'Per pan', kind: 'count', hint: 'Screws or bolts through the rabbet floor holding each pan\'s rim' },
      { path: 'fasteners.diameter', label: 'Hole diameter', kind: 'length' },
      { path: 'fasteners.boltCircleDiameter', label: 'Bolt circle', kind: 'length', hint: 'Diameter they stand on; empty puts them in the middle of the rabbet ring' },
      { path: 'fasteners.length', label: 'Reach below the rim', kind: 'length', hint: 'How far the screw or bolt goes down from the rabbet floor' },
      { path: 'fasteners.edgeWood', label: 'Wood beside a hole', kind: 'length', hint: 'Least wood between a fastener hole and the pocket or rabbet edge' },
      { path: 'fasteners.tnutFlange', label: 'T-nut flange', kind: 'length', hint: 'How far the flange stands below the underside; 0 when let in flush', showIf: fastenerKindIs('bolt-tnut') },
      { path: 'fasteners.counterboreDiameter', label: 'Counterbore diameter', kind: 'length', hint: 'Room for the nut and washer, bored from the underside', showIf: fastenerKindIs('bolt-counterbore') },
      { path: 'fasteners.counterboreDepth', label: 'Counterbore depth', kind: 'length', showIf: fastenerKindIs('bolt-counterbore') },
    ],
  },
  {
    id: 'lobes',
    title: 'Lobes',
    fields: [
      { path: 'lobes.count', label: 'Lobes', kind: 'count' },
      { path: 'lobes.reach', label: 'Reach', kind: 'length', hint: 'How far a root stands out past the valley line' },
      { path: 'lobes.width', label: 'Width', kind: 'length' },
      { path: 'lobes.valley', label: 'Valley', kind: 'length', hint: 'Wood between the trunk and the outline between roots' },
      { path: 'lobes.roundness', label: 'Roundness', kind: 'ratio' },
      { path: 'lobes.irregularity', label: 'Irregularity', kind: 'ratio' },
      { path: 'lobes.seed', label: 'Seed', kind: 'seed' },
      { path: 'lobes.phase', label: 'Phase', kind: 'angle' },
    ],
  },
  {
    id: 'openings',
    title: 'Openings',
    fields: [
      { path: 'access.enabled', label: 'Access openings', kind: 'toggle' },
      { path: 'access.diameter', label: 'Opening diameter', kind: 'length' },
      { path: 'access.offset', label: 'Opening offset', kind: 'length', hint: 'Plate centre to opening centre' },
      { path: 'access.snapToHoleSaw', label: 'Snap to hole-saw sizes', kind: 'toggle' },
      { path: 'centreHoleDiameter', label: 'Centre hole', kind: 'length' },
      { path: 'indexHoleDiameter', label: 'Index holes', kind: 'length' },
    ],
  },
  {
    id: 'cutting',
    title: 'Cutting and sheet',
    fields: [
      { path: 'cutting.bitDiameter', label: 'Router bit', kind: 'length', hint: 'A round cutter leaves no inside bend tighter than its radius' },
      { path: 'cutting.kerf', label: 'Kerf', kind: 'length', hint: 'Width the cut removes' },
      { path: 'cutting.edgeMargin', label: 'Sheet edge margin', kind: 'length' },
      { path: 'cutting.sheetWidth', label: 'Sheet width', kind: 'length' },
      { path: 'cutting.sheetLength', label: 'Sheet length', kind: 'length' },
      { path: 'cutting.minTipRadius', label: 'Least root tip radius', kind: 'length' },
      { path: 'cutting.minRootWidth', label: 'Least root width', kind: 'length', hint: 'Measured halfway out along the root' },
    ],
  },
  {
    id: 'material',
    title: 'Material',
    fields: [
      { path: 'layers', label: 'Layers', kind: 'count' },
      { path: 'sheetThickness', label: 'Sheet thickness', kind: 'length', hint: 'Measured; "3/4 in" panels are often 23/32' },
      { path: 'minWood', label: 'Minimum wood', kind: 'length' },
      { path: 'minFloorGap', label: 'Minimum floor gap', kind: 'length' },
    ],
  },
]

export function getPath(obj: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o && typeof o === 'object' ? (o as Record<string, unknown>)[k] : undefined), obj)
}

export function setPath(obj: object, path: string, value: unknown): void {
  const keys = path.split('.')
  const last = keys.pop()!
  let target = obj as Record<string, unknown>
  for (const k of keys) target = target[k] as Record<string, unknown>
  target[last] = value
}
