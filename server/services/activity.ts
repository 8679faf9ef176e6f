import { and, desc, eq, lt } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { activity, designs, users } from '../database/schema'

type Writer = Pick<Database, 'insert'>

export interface ActivityInput {
  shopId: string
  userId?: string | null
  designId?: string | null
  action: string
  detail?: Record<string, unknown>
}

export async function recordActivity(db: Writer, input: ActivityInput): Promise<void> {
  await db.insert(activity).values({ shopId: input.shopId, userId: input.userId ?? null, designId: input.designId ?? null, action: input.action, detail: input.detail ?? {} })
}

export interface ActivityFilter { designId?: string; userId?: string; before?: Date; limit: number }

/** The shop's activity, newest first, with the names of its person and design. */
export async function listActivity(db: Database, shopId: string, filter: ActivityFilter) {
  const conditions = [eq(activity.shopId, shopId)]
  if (filter.designId) conditions.push(eq(activity.designId, filter.designId))
  if (filter.userId) conditions.push(eq(activity.userId, filter.userId))
  if (filter.before) conditions.push(lt(activity.createdAt, filter.before))
  return db.select({
    id: activity.id,
    action: activity.action,
    detail: activity.detail,
    createdAt: activity.createdAt,
    user: { id: activity.userId, name: users.name },
    design: { id: activity.designId, name: designs.name },
  }).from(activity)
    .leftJoin(users, eq(users.id, activity.userId))
    .leftJoin(designs, eq(designs.id, activity.designId))
    .where(and(...conditions))
    .orderBy(desc(activity.createdAt), desc(activity.id))
    .limit(filter.limit)
}
