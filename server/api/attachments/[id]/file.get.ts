import { readAttachment } from '../../../services/uploads'

/** The stored bytes, with the type read at upload; every role of the shop may view. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  const found = await readAttachment(useDb(), useStorage('uploads'), member.shopId, id)
  if (!found) throw notFound('That file')
  if (!found.bytes) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'The file is listed but its contents are missing from storage' })
  setResponseHeaders(event, {
    'content-type': found.row.contentType,
    'content-length': found.bytes.byteLength,
    'content-disposition': `inline; filename*=UTF-8''${encodeURIComponent(found.row.name)}`,
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, max-age=3600',
  })
  return found.bytes
})
