import { skirtProfilesFileName, skirtProfilesQuerySchema } from '../../../services/skirt'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, skirtProfilesQuerySchema)
  const revision = await exportRevision(event, member)
  return sendExport(event, { kind: 'skirt-profiles', revision, query, font: await templateFont() }, `member:${member.userId}`, 'application/pdf', skirtProfilesFileName(revision))
})
