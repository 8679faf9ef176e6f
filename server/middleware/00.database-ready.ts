import { DATABASE_MESSAGES } from '../utils/db'
import { migrationsReady } from '../utils/migrations'

/** API requests wait for the migration check; 503 with the reason while it fails. */
export default defineEventHandler(async (event) => {
  if (!event.path.startsWith('/api/')) return
  const state = await migrationsReady(useDb())
  if (state.ok) return
  const problem = state.reason === 'unreachable' ? 'unreachable' : 'unmigrated'
  throw createError({
    statusCode: 503,
    statusMessage: 'Service Unavailable',
    message: DATABASE_MESSAGES[problem],
    data: { code: problem === 'unreachable' ? 'database-unavailable' : 'database-not-migrated' },
  })
})
