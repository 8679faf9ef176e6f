import { eq } from 'drizzle-orm'
import { revisions } from '../database/schema'
import { recordActivity } from '../services/activity'

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
      await recordActivity(useDb(), { shopId: member.shopId, userId: member.userId, designId: rev.designId, action: 'export', detail: { file, revision: rev.number, ...getQuery(event) } })
    }
    catch (err: unknown) {
      // A lost log line must not turn a delivered file into an error.
      console.error('activity: export not recorded:', err instanceof Error ? err.message : err)
    }
  })
})
