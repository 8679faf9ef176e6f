import { databaseHealth } from '../services/health'

/** 200 while the database answers; 503 (through the database plugin) while it is away. No session needed. */
export default defineEventHandler(async () => {
  return databaseHealth(useDb())
})
