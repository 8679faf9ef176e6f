import { createShow } from '../../services/shows'
import { newShowSchema } from '../../../shared/utils/show-schemas'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'show:manage')
  const body = await readBodyWith(event, newShowSchema)
  const result = await createShow(useDb(), member, body)
  if (!result.ok) invalid({ name: 'A show with this name is already running in your shop' })
  setResponseStatus(event, 201)
  return result.show
})
