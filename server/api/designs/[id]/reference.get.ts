import { getReference } from '../../../services/uploads'

/** Where the reference image sits under the plate, or null when there is none. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  const db = useDb()
  const design = await db.query.designs.findFirst({ columns: { id: true }, where: (d, { and, eq }) => and(eq(d.id, id), eq(d.shopId, member.shopId)) })
  if (!design) throw notFound('That design')
  return await getReference(db, member.shopId, id)
})
