import { z } from 'zod'
import { PAPER_NAMES, type PaperName } from '../../geometry/export/tiling'

// What Rootplate remembers for each person: how lengths are shown and the
// last export settings. Every field has a default, so `{}` is valid.
export const displayUnits = ['in', 'mm'] as const
export type DisplayUnits = (typeof displayUnits)[number]

export const exportPrefsSchema = z.object({
  paper: z.enum(PAPER_NAMES as [PaperName, ...PaperName[]], { error: `Paper must be one of: ${PAPER_NAMES.join(', ')}` }).default('letter'),
  orientation: z.enum(['auto', 'portrait', 'landscape']).default('auto'),
  units: z.enum(displayUnits).default('in'),
  /** mm */
  overlap: z.number().min(0).max(50).default(12.7),
  /** mm */
  margin: z.number().min(0).max(30).default(6.35),
  includeReference: z.boolean().default(true),
  mirror: z.boolean().default(false),
  /** Which plate layer templates and cut files are for: top (with rabbets), bottom, or all in one. */
  layer: z.enum(['top', 'bottom', 'all']).default('all'),
  /** Pockets and openings in cut files: routed as inside profiles (CNC) or marked for a hole saw with pilots. */
  openings: z.enum(['routed', 'hole-saw']).default('routed'),
  /** Router guide bushing and bit diameters in mm, or null for a flush-trim pattern. */
  bushing: z.object({ bushingDiameter: z.number().positive().max(60), bitDiameter: z.number().positive().max(50) }).nullable().default(null),
})

export const preferencesSchema = z.object({
  units: z.enum(displayUnits).default('in'),
  /** Inch fractions shown to 1/16 or 1/32. */
  fraction: z.union([z.literal(16), z.literal(32)]).default(16),
  export: exportPrefsSchema.prefault({}),
})

export type Preferences = z.output<typeof preferencesSchema>
export type ExportPrefs = z.output<typeof exportPrefsSchema>

/** Stored preferences read leniently: anything unreadable falls back to its default. */
export function readPreferences(stored: unknown): Preferences {
  const parsed = preferencesSchema.safeParse(stored ?? {})
  return parsed.success ? parsed.data : preferencesSchema.parse({})
}
