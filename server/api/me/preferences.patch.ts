import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { users } from '../../database/schema'

// Only what is sent changes; the merged whole is then checked by the full schema.
const patchSchema = z.object({
  units: z.unknown().optional(),
  fraction: z.unknown().optional(),
  // Only the known export settings: unknown keys are refused, not carried along.
  export: z.object(Object.fromEntries(Object.keys(exportPrefsSchema.shape).map(k => [k, z.unknown().optional()]))).strict().optional(),
}).strict()

/** Merges the given preferences into the stored ones and returns the result. */
export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const patch = await readBodyWith(event, patchSchema)
  const db = useDb()
  const row = await db.query.users.findFirst({ columns: { preferences: true }, where: eq(users.id, member.userId) })
  const current = readPreferences(row?.preferences)
  const merged = Object.fromEntries(Object.entries({ ...current, ...patch }).filter(([, v]) => v !== undefined))
  const next = parseOr422(preferencesSchema, { ...merged, export: { ...current.export, ...patch.export } })
  await db.update(users).set({ preferences: next }).where(eq(users.id, member.userId))
  return next
})
