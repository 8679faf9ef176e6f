/** The message shown wherever the app notices its database is away. */
export const DATABASE_AWAY_MESSAGE = 'Rootplate cannot reach its database; your unsaved changes are kept in this tab.'

/** Whether an answer (status and body) says the server's database is away. */
export function isDatabaseAway(status: number | undefined, data: unknown): boolean {
  return status === 503 && !!data && typeof data === 'object' && (data as { data?: { code?: unknown } }).data?.code === 'database-unavailable'
}

/** Set by plugins/database-away.client.ts when an answer says the database is away; cleared once it answers again. */
export function useDatabaseAway() {
  return useState('database-away', () => false)
}
