import { buildSheet, buildSheetQuerySchema } from '../../../services/build-sheet'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, buildSheetQuerySchema)
  const sheet = await buildSheet(useDb(), member.shopId, routeId(event), query, await templateFont())
  return sendFile(event, sheet.pdf, 'application/pdf', sheet.fileName)
})
