import { fileName, tubeWrapQuerySchema } from '../../../services/exports'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, tubeWrapQuerySchema)
  const revision = await exportRevision(event, member)
  return sendExport(event, { kind: 'tube-wrap', revision, query, font: await templateFont() }, `member:${member.userId}`, 'application/pdf', fileName(revision, 'pdf').replace(/\.pdf$/, '-tube-wrap.pdf'))
})
