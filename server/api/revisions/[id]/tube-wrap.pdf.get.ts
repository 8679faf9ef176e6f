import { fileName, tubeWrapPdf, tubeWrapQuerySchema } from '../../../services/exports'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, tubeWrapQuerySchema)
  const { revision, plate } = await revisionPlate(event, member)
  const pdf = await tubeWrapPdf(plate, revision, query, await templateFont())
  return sendFile(event, pdf, 'application/pdf', fileName(revision, 'pdf').replace(/\.pdf$/, '-tube-wrap.pdf'))
})
