import { cutQuerySchema, fileName } from '../../../services/exports'
import { recordShareDownload } from '../../../services/shares'

export default defineEventHandler(event => shareDownload(event, async () => {
  const query = queryWith(event, cutQuerySchema)
  const share = await sharedForDownload(event)
  const body = await sendExport(event, { kind: 'cut-svg', revision: share.revision, query }, `share:${share.id}`, 'image/svg+xml', fileName(share.revision, 'svg'))
  await recordShareDownload(useDb(), share, 'cut.svg', query)
  return body
}))
