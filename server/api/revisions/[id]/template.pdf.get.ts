import { fileName, templateQuerySchema } from '../../../services/exports'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, templateQuerySchema)
  const revision = await exportRevision(event, member)
  return sendExport(event, { kind: 'template', revision, query, font: await templateFont() }, `member:${member.userId}`, 'application/pdf', fileName(revision, 'pdf', query.layer))
})
