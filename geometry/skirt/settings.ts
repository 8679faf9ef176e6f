// Skirt settings: the strips that loft the roots from the plate's edge up onto
// the tube. Saved inside the plate parameters (params.skirt) so every revision
// keeps its own skirt; an old revision without them parses to these defaults.
// Lengths in millimetres. Defaults are common shop practice (from memory).

import { z } from 'zod'

const IN = 25.4

export const SKIRT_PROFILES = ['straight', 'quarter-ellipse', 'eased'] as const
export type SkirtProfile = (typeof SKIRT_PROFILES)[number]

export const skirtSchema = z
  .object({
    /** Height where the strips meet the tube above the plate's top face, mm (in the crotches, or everywhere when rootHeight is empty). */
    height: z.number().finite().min(5).max(3000).default(5 * IN),
    /** Height over the longest root, mm; strips between are interpolated by their run. Empty: one height all round. */
    rootHeight: z.number().finite().min(5).max(3000).nullable().default(null),
    /** straight: flat strips; quarter-ellipse: a fillet meeting the tube upright and the plate flat; eased: half way between the two. */
    profile: z.enum(SKIRT_PROFILES).default('quarter-ellipse'),
    /** Strip width at the plate edge, mm. */
    stripWidth: z.number().finite().min(10).max(600).default(3 * IN),
    /** How much each strip laps over its neighbour, mm (shingled). */
    overlap: z.number().finite().min(0).max(300).default(0.75 * IN),
    /** A fixed number of stations; empty spaces them by the strip width and the edge's curvature. */
    count: z.number().int().min(3).max(720).nullable().default(null),
    /** How far a flat strip's bottom may stand off a curved edge between its two stations, mm; the edge's turning tightens the spacing to keep it. */
    flatness: z.number().finite().min(0.5).max(50).default(3),
  })
  .superRefine((s, ctx) => {
    if (s.overlap >= s.stripWidth) {
      ctx.addIssue({ code: 'custom', path: ['overlap'], message: `Overlap must be less than the strip width.` })
    }
  })

export type SkirtSettings = z.output<typeof skirtSchema>
export type SkirtSettingsInput = z.input<typeof skirtSchema>
