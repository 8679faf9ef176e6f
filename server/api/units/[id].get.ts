import { getUnit } from '../../services/units'

/** One unit with its loans, photos and history. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:view')
  const id = routeId(event)
  const unit = await getUnit(useDb(), member.shopId, id)
  if (!unit) throw notFound('That unit')
  return unit
})
