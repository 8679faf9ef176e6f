import { readAttachment } from '../../../services/uploads'

/**
 * The stored bytes, with the type read at upload; every role of the shop may
 * view. Whatever the file holds runs nowhere: `sandbox` keeps a PDF's scripts
 * (and any page a viewer would make of it) off this origin, only images are
 * shown inline, everything else is a download, and nothing is kept in a cache.
 */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  const found = await readAttachment(useDb(), useStorage('uploads'), member.shopId, id)
  if (!found) throw notFound('That file')
  if (!found.bytes) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'The file is listed but its contents are missing from storage' })
  const inline = found.row.contentType.startsWith('image/')
  setResponseHeaders(event, {
    'content-type': found.row.contentType,
    'content-length': found.bytes.byteLength,
    'content-disposition': `${inline ? 'inline' : 'attachment'}; filename*=UTF-8''${encodeURIComponent(wellFormed(found.row.name))}`,
    'content-security-policy': 'sandbox; default-src \'none\'; img-src \'self\'; style-src \'unsafe-inline\'',
    'x-content-type-options': 'nosniff',
    'cache-control': 'no-store',
  })
  return found.bytes
})
