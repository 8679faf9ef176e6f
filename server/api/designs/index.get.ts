import { listDesigns } from '../../services/designs'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  return listDesigns(useDb(), member.shopId)
})
