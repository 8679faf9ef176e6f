import { z } from 'zod'
import { isMemberOf } from '../../services/shop'

const schema = z.object({ shopId: z.uuid('Pick one of your shops') })

// Moves the signed-in account to another of its shops: a new session there, this one ended.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const { shopId } = await readBodyWith(event, schema)
  if (!(await isMemberOf(useDb(), member.userId, shopId))) throw notFound('That shop')
  await startSession(event, member.userId, shopId)
  return { ok: true }
})
