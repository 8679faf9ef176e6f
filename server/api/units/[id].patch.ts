import { unitPatchSchema } from '../../../shared/utils/unit-schemas'
import { updateUnit, type UnitPatch } from '../../services/units'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:edit')
  const id = routeId(event)
  const body = await readBodyWith(event, unitPatchSchema)
  const result = await updateUnit(useDb(), member, id, body as UnitPatch)
  if (!result.ok) unitFailure(result.reason)
  return { ok: true }
})
