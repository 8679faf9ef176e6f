import { defineConfig } from 'drizzle-kit'
import { databaseUrl } from './server/utils/db'

export default defineConfig({
  dialect: 'postgresql',
  schema: './server/database/schema.ts',
  out: './server/database/migrations',
  dbCredentials: {
    url: databaseUrl(),
  },
})
