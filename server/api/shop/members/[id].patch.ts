import { z } from 'zod'
import { changeRole } from '../../../services/shop'

const schema = z.object({ role: roleField })

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  const userId = routeId(event)
  const { role } = await readBodyWith(event, schema)
  const result = await changeRole(useDb(), member, userId, role)
  if (!result.ok) throw memberChangeError(result.reason)
  return { id: userId, role }
})
