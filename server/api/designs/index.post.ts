import { z } from 'zod'
import { createDesign, showInShop } from '../../services/designs'

const bodySchema = z.object({
  name: textField(120, 'Keep the name under 120 characters').pipe(z.string().min(1, 'Give the design a name')),
  sizeLabel: textField(40, 'Keep the size label under 40 characters').nullish(),
  showId: z.uuid('Pick a show from the list').nullish(),
  params: z.unknown().refine(v => v !== undefined, 'Params are required'),
  note: textField(500, 'Keep the note under 500 characters').optional(),
})

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:create')
  const body = await readBodyWith(event, bodySchema)
  const params = parseParams(body.params)
  const db = useDb()
  if (body.showId && !(await showInShop(db, member.shopId, body.showId))) {
    invalid({ showId: 'That show is not in your shop' })
  }
  const created = await createDesign(db, member, { ...body, params })
  setResponseStatus(event, 201)
  return created
})
