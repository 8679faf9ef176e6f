import { addAttachment } from '../../../services/uploads'

/** A photo (or PDF) of a built unit or pattern: multipart, field `file`. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:edit')
  const id = routeId(event)
  const file = await readUpload(event)
  const saved = await addAttachment(useDb(), useStorage('uploads'), member, { unitId: id }, file)
  if (!saved) throw notFound('That unit')
  setResponseStatus(event, 201)
  return saved
})
