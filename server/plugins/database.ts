import { databaseUrl, databaseProblem, DATABASE_MESSAGES } from '../utils/db'
import { checkMigrations, markMigrationsChecked } from '../utils/migrations'

function safeUrl(): string {
  try {
    const u = new URL(databaseUrl())
    u.password = ''
    return u.toString()
  }
  catch {
    return '(unparseable DATABASE_URL)'
  }
}

/**
 * 1. Any error that comes from the database being away (or not being
 *    Rootplate's) becomes a 503 with a clear JSON message, whatever route
 *    threw it. Nitro calls this hook synchronously before its error handler,
 *    so changing the error here changes the answer.
 * 2. On start, a reachable database without this build's migrations stops
 *    the server with a clear message; an unreachable one is checked again on
 *    the first request once it is back (server/middleware/00.database-ready.ts).
 */
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error) => {
    const problem = databaseProblem(error)
    if (!problem) return
    const e = error as { statusCode?: number; statusMessage?: string; message: string; unhandled?: boolean; fatal?: boolean; data?: unknown }
    e.statusCode = 503
    e.statusMessage = 'Service Unavailable'
    e.message = DATABASE_MESSAGES[problem]
    e.unhandled = false
    e.fatal = false
    e.data = { code: problem === 'unreachable' ? 'database-unavailable' : 'database-not-migrated' }
  })

  if (process.env.ROOTPLATE_SKIP_MIGRATION_CHECK === '1') return
  checkMigrations(useDb()).then((state) => {
    if (state.ok) {
      markMigrationsChecked()
      return
    }
    if (state.reason === 'unreachable') {
      console.warn(`[rootplate] the database at ${safeUrl()} is not reachable yet (${state.message}); API requests answer 503 until it is`)
      return
    }
    console.error(`[rootplate] refusing to serve: the database at ${safeUrl()} does not carry Rootplate's migrations (${state.message}).\n`
      + '  Run `npm run db:migrate` (or `npm start`, which migrates), or check PG_PORT / DATABASE_URL: another checkout\'s database may be on this port.')
    process.exit(1)
  }, (err: unknown) => {
    console.error('[rootplate] could not check the database\'s migrations:', err)
  })
})
