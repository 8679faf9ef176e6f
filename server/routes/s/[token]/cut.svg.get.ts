import { cutQuerySchema, cutSvg, fileName } from '../../../services/exports'
import { recordShareDownload } from '../../../services/shares'

export default defineEventHandler(event => shareDownload(event, async () => {
  const query = queryWith(event, cutQuerySchema)
  const { share, plate } = await sharedRevision(event)
  const body = cutSvg(plate, query)
  await recordShareDownload(useDb(), share, 'cut.svg', query)
  return sendFile(event, body, 'image/svg+xml', fileName(share.revision, 'svg'))
}))
