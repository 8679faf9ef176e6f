import { fileName, cutDxf, cutQuerySchema } from '../../../services/exports'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, cutQuerySchema)
  const { revision, plate } = await revisionPlate(event, member)
  return sendFile(event, cutDxf(plate, query, revision), 'application/dxf', fileName(revision, 'dxf', query.layer))
})
