import { eq } from 'drizzle-orm'
import { revisions } from '../database/schema'
import { recordActivity } from '../services/activity'
import { cutQuerySchema, templateQuerySchema, tubeWrapQuerySchema } from '../services/exports'
import { buildSheetQuerySchema } from '../services/build-sheet'
import { skirtProfilesQuerySchema } from '../services/skirt'
import type { z } from 'zod'

// Each file's own query schema: the log keeps the options the route took, as it read them.
const querySchemas: Record<string, z.ZodType> = {
  'template.pdf': templateQuerySchema,
  'tube-wrap.pdf': tubeWrapQuerySchema,
  'cut.dxf': cutQuerySchema,
  'cut.svg': cutQuerySchema,
  'build-sheet.pdf': buildSheetQuerySchema,
  'skirt-profiles.pdf': skirtProfilesQuerySchema,
}

/**
 * The options of an export as the route read them: only the fields its
 * schema knows and the request named, with their parsed values. Anything
 * else in the query (unknown names, long junk) is not logged.
 */
export function knownExportOptions(file: string, query: Record<string, unknown>): Record<string, unknown> {
  const schema = querySchemas[file]
  if (!schema) return {}
  const parsed = schema.safeParse(query)
  if (!parsed.success || !parsed.data || typeof parsed.data !== 'object') return {}
  const data = parsed.data as Record<string, unknown>
  return Object.fromEntries(Object.keys(query).filter(k => Object.hasOwn(data, k)).map(k => [k, data[k]]))
}

// Exports are recorded here, after a successful response, so the export
// routes themselves stay one guard and one service call.
const exportPath = /^\/api\/revisions\/([0-9a-f-]{36})\/([\w.-]+\.(?:pdf|dxf|svg))$/

export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('afterResponse', async (event) => {
    const member = event.context.member
    if (!member || event.method !== 'GET' || getResponseStatus(event) !== 200) return
    const match = exportPath.exec(event.path.split('?')[0] ?? '')
    if (!match) return
    const [, revisionId, file] = match
    try {
      const [rev] = await useDb().select({ designId: revisions.designId, number: revisions.number }).from(revisions).where(eq(revisions.id, revisionId!))
      if (!rev) return
      await recordActivity(useDb(), { shopId: member.shopId, userId: member.userId, designId: rev.designId, action: 'export', detail: { ...knownExportOptions(file!, getQuery(event)), file, revision: rev.number } })
    }
    catch (err: unknown) {
      // A lost log line must not turn a delivered file into an error.
      console.error('activity: export not recorded:', err instanceof Error ? err.message : err)
    }
  })
})
