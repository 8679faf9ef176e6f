import { fileName, templatePdf, templateQuerySchema } from '../../../services/exports'
import { recordShareDownload } from '../../../services/shares'

export default defineEventHandler(event => shareDownload(event, async () => {
  const query = queryWith(event, templateQuerySchema)
  const { share, plate } = await sharedRevision(event)
  const pdf = await templatePdf(plate, share.revision, query, await templateFont())
  await recordShareDownload(useDb(), share, 'template.pdf', query)
  return sendFile(event, pdf, 'application/pdf', fileName(share.revision, 'pdf'))
}))
