import { unitCreateSchema } from '../../../shared/utils/unit-schemas'
import { createUnit, type NewUnit } from '../../services/units'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:edit')
  const body = await readBodyWith(event, unitCreateSchema)
  const result = await createUnit(useDb(), member, body as NewUnit)
  if (!result.ok) unitFailure(result.reason)
  setResponseStatus(event, 201)
  return { id: result.id }
})
