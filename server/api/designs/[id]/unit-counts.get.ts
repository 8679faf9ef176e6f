import { unitCounts } from '../../../services/units'

/** Units built from each revision of the design, so an edit is made knowing what is out there. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  const counts = await unitCounts(useDb(), member.shopId, id)
  if (!counts) throw notFound('That design')
  return counts
})
