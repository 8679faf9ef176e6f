import { fileName, cutSvg, cutQuerySchema } from '../../../services/exports'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, cutQuerySchema)
  const { revision, plate } = await revisionPlate(event, member)
  return sendFile(event, cutSvg(plate, query), 'image/svg+xml', fileName(revision, 'svg', query.layer))
})
