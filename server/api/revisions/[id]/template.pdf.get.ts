import { fileName, templatePdf, templateQuerySchema } from '../../../services/exports'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, templateQuerySchema)
  const { revision, plate } = await revisionPlate(event, member)
  const pdf = await templatePdf(plate, revision, query, await templateFont())
  return sendFile(event, pdf, 'application/pdf', fileName(revision, 'pdf', query.layer))
})
