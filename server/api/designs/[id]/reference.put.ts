import { z } from 'zod'
import { setReference } from '../../../services/uploads'

const finite = (what: string) => z.number({ error: `${what} must be a number` }).finite()
const bodySchema = z.object({
  attachmentId: z.uuid({ error: 'Choose one of this design\'s images' }),
  x: finite('The position').min(-100_000).max(100_000),
  y: finite('The position').min(-100_000).max(100_000),
  rotation: finite('The turn').min(-360).max(360),
  mmPerPixel: finite('The scale').positive('The scale must be above zero').max(1000, 'That scale is larger than any drawing'),
  opacity: finite('The opacity').min(0.05, 'Keep it at least 5 % visible').max(1),
})

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:edit')
  const id = routeId(event)
  const body = await readBodyWith(event, bodySchema)
  const result = await setReference(useDb(), member, id, body)
  if (!result.ok) {
    if (result.reason === 'not-found') throw notFound('That design')
    invalid({ attachmentId: 'Choose an image attached to this design' })
  }
  return result.reference
})
