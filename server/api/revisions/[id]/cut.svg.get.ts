import { fileName, cutQuerySchema } from '../../../services/exports'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, cutQuerySchema)
  const revision = await exportRevision(event, member)
  return sendExport(event, { kind: 'cut-svg', revision, query }, `member:${member.userId}`, 'image/svg+xml', fileName(revision, 'svg', query.layer))
})
