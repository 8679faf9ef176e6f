import { updateShow } from '../../services/shows'
import { showChangeSchema } from '../../../shared/utils/show-schemas'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'show:manage')
  const id = routeId(event)
  const body = await readBodyWith(event, showChangeSchema)
  const result = await updateShow(useDb(), member, id, body)
  if (!result.ok) {
    if (result.reason === 'not-found') throw notFound('That show')
    invalid({ name: 'A show with this name is already running in your shop' })
  }
  return result.show
})
