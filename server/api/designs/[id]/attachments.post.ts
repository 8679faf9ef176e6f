import { addAttachment } from '../../../services/uploads'

/** Attaches an image or PDF to a design: multipart, field `file`; the type comes from the bytes. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'attachment:add')
  const id = routeId(event)
  const file = await readUpload(event)
  const saved = await addAttachment(useDb(), useStorage('uploads'), member, { designId: id }, file)
  if (!saved) throw notFound('That design')
  setResponseStatus(event, 201)
  return saved
})
