import { listShows } from '../services/designs'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  return listShows(useDb(), member.shopId)
})
