import { defineConfig } from 'drizzle-kit'

export default defineConfig({
  dialect: 'postgresql',
  schema: './server/database/schema.ts',
  out: './server/database/migrations',
  dbCredentials: {
    url: process.env.DATABASE_URL ?? `postgres://postgres@127.0.0.1:${process.env.PG_PORT ?? 55432}/rootplate`,
  },
})
