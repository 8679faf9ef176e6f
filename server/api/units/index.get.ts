import { unitFilterSchema } from '../../../shared/utils/unit-schemas'
import { listUnits } from '../../services/units'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:view')
  const filter = queryWith(event, unitFilterSchema)
  return listUnits(useDb(), member.shopId, filter as Parameters<typeof listUnits>[2])
})
