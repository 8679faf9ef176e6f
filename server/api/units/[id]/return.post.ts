import { returnSchema } from '../../../../shared/utils/unit-schemas'
import { returnUnit } from '../../../services/units'

/** Records the return of the unit's open loan; it goes back in stock. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:edit')
  const id = routeId(event)
  const body = await readBodyWith(event, returnSchema)
  const result = await returnUnit(useDb(), member, id, body.returnedOn)
  if (!result.ok) unitFailure(result.reason)
  return { ok: true }
})
