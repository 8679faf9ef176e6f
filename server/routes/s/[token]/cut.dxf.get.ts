import { cutQuerySchema, fileName } from '../../../services/exports'
import { recordShareDownload } from '../../../services/shares'

// The query is parsed by the export service's own schema and passed on whole,
// so options it gains (such as the layer) work through share links too.
export default defineEventHandler(event => shareDownload(event, async () => {
  const query = queryWith(event, cutQuerySchema)
  const share = await sharedForDownload(event)
  const body = await sendExport(event, { kind: 'cut-dxf', revision: share.revision, query }, `share:${share.id}`, 'application/dxf', fileName(share.revision, 'dxf'))
  await recordShareDownload(useDb(), share, 'cut.dxf', query)
  return body
}))
