import { loanSchema } from '../../../../shared/utils/unit-schemas'
import { lendUnit } from '../../../services/units'

/** Lends a unit out: borrower, out and due dates. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:edit')
  const id = routeId(event)
  const body = await readBodyWith(event, loanSchema)
  const result = await lendUnit(useDb(), member, id, body)
  if (!result.ok) unitFailure(result.reason)
  setResponseStatus(event, 201)
  return { id: result.loanId }
})
