// Deliberate breaks, each one a change a user would notice (a wrong figure,
// a file that cuts wrong, a stranger let in). `npm run mutate` applies them
// one at a time and runs `tests`, the narrowest tests that should fail.
// `find` must stand exactly once in `file`. `whyMissed` records a known miss.
export interface Break {
  id: string
  area: 'units' | 'statics' | 'nesting' | 'tiling' | 'exports' | 'geometry' | 'guards' | 'lifetimes' | 'limits'
  file: string
  find: string
  replace: string
  /** What a user would see. */
  what: string
  tests: string[]
  /** Vitest -t filter, when one file holds far more than the break concerns. */
  testName?: string
  whyMissed?: string
}

const GEO_UNITS = 'tests/unit/geometry/units.test.ts'
const STABILITY = 'tests/unit/stability'
const NEST = 'tests/unit/nest'
const GUARDS = 'tests/e2e/route-guards.test.ts'

export const BREAKS: Break[] = [
  // Units: the inch, fractions, pounds and pound-force.
  { id: 'inch-is-25', area: 'units', file: 'geometry/units.ts', find: 'return (inches * 254) / 10', replace: 'return inches * 25', what: 'every inch length 1.6 % short', tests: [GEO_UNITS] },
  { id: 'feet-are-10-inches', area: 'units', file: 'geometry/units.ts', find: 'inchesToMm(feet * 12 + inches)', replace: 'inchesToMm(feet * 10 + inches)', what: "1' 3\" read as 13 in", tests: [GEO_UNITS] },
  { id: 'pt-per-mm', area: 'units', file: 'geometry/export/units.ts', find: 'export const PT_PER_MM = PT_PER_INCH / MM_PER_INCH', replace: 'export const PT_PER_MM = PT_PER_INCH / 25', what: 'templates print 1.6 % large', tests: ['tests/unit/export/template-pdf.test.ts'] },
  { id: 'lbf-without-gravity', area: 'units', file: 'geometry/stability/format.ts', find: 'export const N_PER_LBF = KG_PER_LB * STANDARD_GRAVITY', replace: 'export const N_PER_LBF = KG_PER_LB', what: 'push shown in lbf ten times too large', tests: [STABILITY] },
  { id: 'lb-typed-as-kg', area: 'units', file: 'geometry/stability/format.ts', find: "unit.startsWith('k') ? value : value * KG_PER_LB", replace: "unit.startsWith('k') ? value : value / KG_PER_LB", what: '"10 lb" typed reads as 22 kg', tests: [STABILITY] },
  { id: 'mass-shown-in-kg-as-lb', area: 'units', file: 'geometry/stability/format.ts', find: "`${trim(kg / KG_PER_LB, 1)} lb`", replace: "`${trim(kg, 1)} lb`", what: 'weights in lb show the kg figure', tests: [STABILITY] },

  // Statics.
  { id: 'gravity-10', area: 'statics', file: 'geometry/stability/stability.ts', find: 'export const STANDARD_GRAVITY = 9.80665', replace: 'export const STANDARD_GRAVITY = 10', what: 'every force 2 % high', tests: [STABILITY] },
  { id: 'tip-angle-atan-h-over-d', area: 'statics', file: 'geometry/stability/support.ts', find: 'return { distance, angle: Math.atan2(distance, Math.max(height, 1e-9)) * DEG, edge: best }', replace: 'return { distance, angle: Math.atan2(Math.max(height, 1e-9), distance) * DEG, edge: best }', what: 'tipping angle is the complement', tests: [STABILITY] },
  { id: 'push-ignores-height', area: 'statics', file: 'geometry/stability/stability.ts', find: '(weightNewtons * (tip.distance / 1000)) / (pushHeight / 1000)', replace: '(weightNewtons * (tip.distance / 1000)) / 1', what: 'the push that tips it ignores where it is pushed', tests: [STABILITY] },

  { id: 'caster-load-even-share', area: 'statics', file: 'geometry/stability/support.ts', find: '  return { worst: worst * mass, caster, stance, held: true }', replace: '  return { worst: mass / n, caster, stance, held: true }', what: 'the load per caster is the even share, not the worst caster on an uneven floor', tests: [STABILITY] },
  { id: 'caster-load-any-stance', area: 'statics', file: 'geometry/stability/support.ts', find: '        if (la < -eps || lb < -eps || lc < -eps) continue', replace: '', what: 'stances that do not hold the centre of mass count', tests: [STABILITY] },
  { id: 'caster-rating-made-up', area: 'statics', file: 'geometry/stability/unit-params.ts', find: '  casterRating: z.number().finite().min(0).max(5000).nullable().optional(),', replace: '  casterRating: z.number().finite().min(0).max(5000).nullable().optional().default(113.398),', what: 'a made-up 250 lb caster rating', tests: [STABILITY] },

  // Geometry figures a shop buys and cuts by.
  { id: 'area-keeps-holes', area: 'geometry', file: 'geometry/metrics/metrics.ts', find: 'const area = signedArea(input.outline) - holeArea', replace: 'const area = signedArea(input.outline)', what: 'plate area and weight count the holes as wood', tests: ['tests/unit/geometry/areas.test.ts', 'tests/unit/geometry/presets-metrics.test.ts'] },
  { id: 'guide-offset-full', area: 'geometry', file: 'geometry/export/guide-line.ts', find: '  return (bushing - bit) / 2', replace: '  return bushing - bit', what: 'router pattern offset twice too far', tests: ['tests/unit/export/guide-line.test.ts'] },
  { id: 'strip-length-run-only', area: 'geometry', file: 'geometry/skirt/strips.ts', find: "if (profile === 'straight') return Math.hypot(run, rise)", replace: "if (profile === 'straight') return run + rise", what: 'straight skirt strips cut too long', tests: ['tests/unit/geometry/skirt.test.ts'] },
  { id: 'wrap-radius-for-diameter', area: 'exports', file: 'geometry/export/tube-wrap-pdf.ts', find: 'Math.PI * plate.trunk.diameter', replace: 'Math.PI * plate.trunk.diameter / 2', what: 'tube wrap half as long as the tube round', tests: ['tests/unit/export/tube-wrap.test.ts'] },

  { id: 'no-access-room-silent', area: 'geometry', file: 'geometry/checks/findings.ts', find: '    ...accessRoomFindings(input),', replace: '', what: 'a size with no room for access openings says nothing (counterweight and pan screws out of reach)', tests: ['tests/unit/geometry/families.test.ts'] },
  { id: 'block-fit-zero-as-count', area: 'statics', file: 'components/stability/StabilityFigures.vue', find: '  if (a.layout.perLayer > 0) return `${a.layout.perLayer} fit a layer`', replace: '  return `${a.layout.perLayer} fit a layer`', what: 'the panel says "0 fit a layer" instead of that no block fits', tests: ['tests/nuxt/stability-figures.test.ts'] },

  // Tiling.
  { id: 'tiles-ignore-overlap', area: 'tiling', file: 'geometry/export/tiling.ts', find: '  const step = printable - overlap\n', replace: '  const step = printable\n', what: 'tiled sheets do not overlap for taping', tests: ['tests/unit/export/tiling.test.ts'] },
  { id: 'tiles-one-short', area: 'tiling', file: 'geometry/export/tiling.ts', find: 'return Math.max(1, Math.ceil((extent - overlap) / step - 1e-9))', replace: 'return Math.max(1, Math.floor((extent - overlap) / step - 1e-9))', what: 'a column of the template is missing', tests: ['tests/unit/export/tiling.test.ts'] },

  // Exports.
  { id: 'dxf-units-always-mm', area: 'exports', file: 'geometry/export/dxf.ts', find: "d.setUnits(cut.units === 'in' ? 'Inches' : 'Millimeters')", replace: "d.setUnits('Millimeters')", what: 'an inch DXF says millimetres: a CNC cuts it 25.4 times small', tests: ['tests/unit/export/dxf.test.ts'] },
  { id: 'cut-scale-inch', area: 'exports', file: 'geometry/export/cut-layers.ts', find: "const k = o.units === 'in' ? 1 / 25.4 : 1", replace: "const k = o.units === 'in' ? 1 / 25 : 1", what: 'inch cut files 1.6 % large', tests: ['tests/unit/export/dxf.test.ts', 'tests/unit/export/svg.test.ts'] },
  { id: 'sheet-dxf-units-mm', area: 'exports', file: 'geometry/nest/layout-dxf.ts', find: "d.setUnits(options.units === 'in' ? 'Inches' : 'Millimeters')", replace: "d.setUnits('Millimeters')", what: 'the sheet DXF in inches says millimetres', tests: [NEST, 'tests/e2e/sheet-plan.test.ts'] },

  // Nesting.
  { id: 'nest-no-kerf', area: 'nesting', file: 'geometry/nest/nest.ts', find: 'Math.max(0, sheet.kerf - FIT_ROUNDING) / 2', replace: '0', what: 'parts nested touching: the saw eats into the next part', tests: [NEST] },
  { id: 'nest-grain-ignored', area: 'nesting', file: 'geometry/nest/nest.ts', find: "if (!grain || d === 0 || d === 180) set.add(d)", replace: 'set.add(d)', what: 'parts turned across the grain when the grain must run along', tests: [NEST] },
  { id: 'glue-one-line-more', area: 'nesting', file: 'geometry/nest/plan.ts', find: '? layouts.reduce((s, l) => s + (l.sheets - 1) * sheetArea, 0)', replace: '? layouts.reduce((s, l) => s + l.sheets * sheetArea, 0)', what: 'glue for a glue line too many per panel', tests: [NEST] },

  // Guards: a role or a stranger let in.
  { id: 'guard-reference-delete', area: 'guards', file: 'server/api/designs/[id]/reference.delete.ts', find: "requireAction(event, 'design:edit')", replace: "requireAction(event, 'design:view')", what: 'a viewer removes the reference image', tests: [GUARDS] },
  { id: 'guard-unit-return', area: 'guards', file: 'server/api/units/[id]/return.post.ts', find: "requireAction(event, 'unit:edit')", replace: "requireAction(event, 'unit:view')", what: 'a viewer returns a unit on loan', tests: [GUARDS] },
  { id: 'guard-show-create', area: 'guards', file: 'server/api/shows/index.post.ts', find: "requireAction(event, 'show:manage')", replace: "requireAction(event, 'design:view')", what: 'a builder makes shows', tests: [GUARDS] },
  { id: 'guard-share-create', area: 'guards', file: 'server/api/revisions/[id]/shares.post.ts', find: "requireAction(event, 'design:share')", replace: "requireAction(event, 'design:view')", what: 'a viewer sends the cut files to an outside shop', tests: [GUARDS, 'tests/e2e/shares.test.ts'] },
  { id: 'guard-members-patch', area: 'guards', file: 'server/api/shop/members/[id].patch.ts', find: "requireAction(event, 'shop:members')", replace: "requireAction(event, 'design:edit')", what: 'a designer makes themselves lead', tests: [GUARDS] },
  { id: 'guard-activity', area: 'guards', file: 'server/api/shop/activity.get.ts', find: "requireAction(event, 'shop:activity')", replace: "requireAction(event, 'design:view')", what: 'a viewer reads the activity log', tests: [GUARDS] },
  { id: 'permission-designer-members', area: 'guards', file: 'shared/utils/permissions.ts', find: "  'shop:members': ['lead'],", replace: "  'shop:members': ['lead', 'designer'],", what: 'designers manage the crew', tests: ['tests/unit/services/permissions.test.ts', GUARDS] },
  { id: 'shop-scope-design', area: 'guards', file: 'server/services/designs.ts', find: "    .where(and(eq(designs.id, sql.placeholder('designId')), eq(designs.shopId, sql.placeholder('shopId'))))", replace: "    .where(eq(designs.id, sql.placeholder('designId')))", what: "another shop's design opens", tests: [GUARDS, 'tests/e2e/routes.test.ts'] },

  // Lifetimes.
  { id: 'invitation-30-days', area: 'lifetimes', file: 'server/services/invitations.ts', find: 'export const INVITATION_DAYS = 7', replace: 'export const INVITATION_DAYS = 30', what: 'invitations live a month', tests: ['tests/e2e/lifetimes.test.ts'] },
  { id: 'reset-one-day', area: 'lifetimes', file: 'server/services/auth.ts', find: 'export const RESET_MINUTES = 60', replace: 'export const RESET_MINUTES = 1440', what: 'reset links live a day', tests: ['tests/e2e/lifetimes.test.ts'] },
  { id: 'session-idle-day', area: 'lifetimes', file: 'server/services/sessions.ts', find: 'export const defaultPolicy: SessionPolicy = { idleMinutes: 12 * 60, maxDays: 30 }', replace: 'export const defaultPolicy: SessionPolicy = { idleMinutes: 24 * 60, maxDays: 30 }', what: 'an idle session lasts a day', tests: ['tests/e2e/lifetimes.test.ts'] },
  { id: 'session-max-year', area: 'lifetimes', file: 'server/services/sessions.ts', find: 'expiresAt: new Date(Date.now() + policy.maxDays * 86_400_000),', replace: 'expiresAt: new Date(Date.now() + 365 * 86_400_000),', what: 'a session lives a year', tests: ['tests/e2e/lifetimes.test.ts'] },
  { id: 'share-days-cap', area: 'lifetimes', file: 'server/services/shares.ts', find: 'export const MAX_SHARE_DAYS = 90', replace: 'export const MAX_SHARE_DAYS = 9000', what: 'share links for 25 years', tests: ['tests/e2e/shares.test.ts'] },

  // Limits.
  { id: 'sign-in-free-100', area: 'limits', file: 'server/services/sign-in-limits.ts', find: '  FREE_FAILURES: 10,', replace: '  FREE_FAILURES: 100,', what: 'a hundred free password guesses', tests: ['tests/unit/services/sign-in-limits.test.ts', 'tests/e2e/auth.test.ts'] },
  { id: 'sign-in-no-pause', area: 'limits', file: 'server/services/sign-in-limits.ts', find: '  FIRST_DELAY_MS: 250,', replace: '  FIRST_DELAY_MS: 0,', what: 'guesses past the free ones are not slowed', tests: ['tests/unit/services/sign-in-limits.test.ts', 'tests/e2e/auth.test.ts'] },
  { id: 'resets-per-hour-30', area: 'limits', file: 'server/services/rate-limits.ts', find: 'resetsPerRecipient: { max: 3, windowSeconds: HOUR },', replace: 'resetsPerRecipient: { max: 30, windowSeconds: HOUR },', what: 'thirty reset mails an hour to one address', tests: ['tests/e2e/accounts-hardening.test.ts', 'tests/e2e/auth.test.ts'] },
  { id: 'mail-per-recipient-500', area: 'limits', file: 'server/services/rate-limits.ts', find: 'mailPerRecipient: { max: 5, windowSeconds: HOUR },', replace: 'mailPerRecipient: { max: 500, windowSeconds: HOUR },', what: 'an outside address flooded with share mails', tests: ['tests/e2e/accounts-hardening.test.ts'] },
  { id: 'json-depth-uncapped', area: 'limits', file: 'server/utils/validation.ts', find: 'export const MAX_JSON_DEPTH = 32', replace: 'export const MAX_JSON_DEPTH = 1_000_000', what: 'a deep JSON body walks the server thread', tests: ['tests/unit/services/json-depth.test.ts', 'tests/e2e/stalls.test.ts'] },
  { id: 'labels-uncapped', area: 'limits', file: 'server/services/labels.ts', find: 'export const MAX_LABELS_PER_SHEET = 200', replace: 'export const MAX_LABELS_PER_SHEET = 200_000', what: 'one viewer asks for every label at once', tests: ['tests/e2e/stalls.test.ts'] },
  { id: 'body-limit-design-16mb', area: 'limits', file: 'server/utils/request-limits.ts', find: '  design: 256 * 1024,', replace: '  design: 16 * 1024 * 1024,', what: 'a 16 MB design body is parsed', tests: ['tests/e2e/hardening.test.ts'] },
  { id: 'body-limit-auth', area: 'limits', file: 'server/utils/request-limits.ts', find: '  auth: 8 * 1024,', replace: '  auth: 1024 * 1024,', what: 'a megabyte sign-in body is parsed', tests: ['tests/e2e/hardening.test.ts'] },
  { id: 'upload-limit-150mb', area: 'limits', file: 'server/utils/upload.ts', find: 'export const UPLOAD_LIMIT = 15 * 1024 * 1024', replace: 'export const UPLOAD_LIMIT = 150 * 1024 * 1024', what: 'uploads of 150 MB', tests: ['tests/e2e/uploads.test.ts'] },
]
