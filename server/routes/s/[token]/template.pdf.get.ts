import { fileName, templateQuerySchema } from '../../../services/exports'
import { recordShareDownload } from '../../../services/shares'

export default defineEventHandler(event => shareDownload(event, async () => {
  const query = queryWith(event, templateQuerySchema)
  const share = await sharedForDownload(event)
  const body = await sendExport(event, { kind: 'template', revision: share.revision, query, font: await templateFont() }, `share:${share.id}`, 'application/pdf', fileName(share.revision, 'pdf'))
  await recordShareDownload(useDb(), share, 'template.pdf', query)
  return body
}))
