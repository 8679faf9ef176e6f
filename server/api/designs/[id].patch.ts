import { updateDesignDetails } from '../../services/shows'
import { designDetailsSchema } from '../../../shared/utils/show-schemas'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:edit')
  const id = routeId(event)
  const body = await readBodyWith(event, designDetailsSchema)
  const result = await updateDesignDetails(useDb(), member, id, body)
  if (!result.ok) {
    if (result.reason === 'not-found') throw notFound('That design')
    invalid({ showId: 'That show is not in your shop' })
  }
  return result.design
})
