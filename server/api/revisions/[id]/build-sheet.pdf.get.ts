import { buildSheetFileName, buildSheetQuerySchema } from '../../../services/build-sheet'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, buildSheetQuerySchema)
  const revision = await exportRevision(event, member)
  return sendExport(event, { kind: 'build-sheet', revision, query, font: await templateFont() }, `member:${member.userId}`, 'application/pdf', buildSheetFileName(revision))
})
