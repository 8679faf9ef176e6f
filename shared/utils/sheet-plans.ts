// What a sheet plan request may ask for: the one schema for the server's
// validation and the page's form bounds. Lengths in millimetres.
import { z } from 'zod'

const inch = (n: number) => n * 25.4

/** The most plates one plan takes (the nesting is bounded in time as well). */
export const PLAN_MAX_PLATES = 60
export const PLAN_MAX_COUNT = 30
export const PLAN_MAX_DESIGNS = 24

const mm = (min: number, max: number, what: string) =>
  z.number({ error: `${what} must be a number of millimetres` }).finite().min(min, `${what} must be at least ${min} mm`).max(max, `${what} must be at most ${max} mm`)

export const planSheetSchema = z.object({
  width: mm(inch(12), inch(144), 'Sheet width'),
  height: mm(inch(12), inch(144), 'Sheet length'),
  thickness: mm(3, 40, 'Sheet thickness'),
  margin: mm(0, inch(6), 'Edge margin'),
  kerf: mm(0, inch(1), 'Kerf'),
}).refine((s) => s.width > 2 * s.margin + 10 && s.height > 2 * s.margin + 10, { message: 'The edge margin leaves no room on the sheet', path: ['margin'] })

export const sheetPlanRequestSchema = z.object({
  items: z.array(z.object({
    designId: z.uuid({ error: 'Choose a design of your shop' }),
    count: z.number({ error: 'Give how many plates' }).int('Give a whole number of plates').min(0, 'At least 0 plates').max(PLAN_MAX_COUNT, `At most ${PLAN_MAX_COUNT} plates of one design`),
  }), { error: 'Choose the designs to plan' })
    .min(1, 'Choose at least one design')
    .max(PLAN_MAX_DESIGNS, `At most ${PLAN_MAX_DESIGNS} designs in one plan`)
    .refine((items) => new Set(items.map((i) => i.designId)).size === items.length, 'Each design once')
    .refine((items) => items.reduce((s, i) => s + i.count, 0) >= 1, 'Plan at least one plate')
    .refine((items) => items.reduce((s, i) => s + i.count, 0) <= PLAN_MAX_PLATES, `At most ${PLAN_MAX_PLATES} plates in one plan`),
  sheet: planSheetSchema,
  workflow: z.enum(['panels', 'layers'], { error: 'Choose panels (glue first) or layers (cut, then glue)' }).default('panels'),
  grain: z.boolean({ error: 'Grain is on or off' }).default(false),
})

export type SheetPlanRequest = z.output<typeof sheetPlanRequestSchema>

export const layoutFileSchema = sheetPlanRequestSchema.extend({
  units: z.enum(['in', 'mm'], { error: 'Units must be in or mm' }).default('in'),
})

export const layoutDxfSchema = layoutFileSchema.extend({
  index: z.number({ error: 'Choose a sheet' }).int().min(0, 'Choose a sheet').max(999, 'Choose a sheet'),
  /** As on a plate's cut file: pockets and openings routed (CNC, default) or marked for a hole saw with pilots. */
  openings: z.enum(['routed', 'hole-saw'], { error: 'Openings must be one of: routed, hole-saw' }).default('routed'),
})

/** Sheet sizes a shop buys: 4 x 8 ft (US Product Standard PS 1-19) and the metric 1220 x 2440 mm panel. */
export const SHEET_PRESETS = [
  { id: '48x96', label: '48 x 96 in', width: inch(48), height: inch(96) },
  { id: '1220x2440', label: '1220 x 2440 mm', width: 1220, height: 2440 },
] as const

/** The page's sheet settings (mm). */
export interface SheetSettings {
  width: number
  height: number
  thickness: number
  margin: number
  kerf: number
  workflow: 'panels' | 'layers'
  grain: boolean
}
