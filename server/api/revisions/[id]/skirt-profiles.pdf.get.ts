import { skirtProfilesFileName, skirtProfilesPdf, skirtProfilesQuerySchema } from '../../../services/skirt'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, skirtProfilesQuerySchema)
  const { revision, plate } = await revisionPlate(event, member)
  const pdf = await skirtProfilesPdf(plate, revision, query, await templateFont())
  return sendFile(event, pdf, 'application/pdf', skirtProfilesFileName(revision))
})
