import { getDesign } from '../../services/designs'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  const design = await getDesign(useDb(), member.shopId, id)
  if (!design) throw notFound('That design')
  return design
})
