import { rmSync } from 'node:fs'
import { resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { TestProject } from 'vitest/node'
import { startMailFake } from '../../scripts/mail-fake'
import { applyMigrations } from '../../scripts/migrate'
import { hasher, runSeed } from '../../scripts/seed'
import { recreateDatabase, seedOtherShop, testDatabaseUrl } from './support/fixtures'
import { startBuiltServer } from './support/server'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
    databaseUrl: string
    other: { designId: string; revisionId: string }
    uploadsDir: string
    mailDir: string
  }
}

/**
 * One built server for every e2e file, on a fresh test database holding the
 * demo shop and a second shop. `npm test` builds first; run it, not vitest alone.
 */
export default async function setup(project: TestProject) {
  const databaseUrl = testDatabaseUrl()
  await recreateDatabase(databaseUrl)
  await applyMigrations(databaseUrl)
  await runSeed(databaseUrl)
  const other = await seedOtherShop(databaseUrl, p => hasher.make(p))

  // Uploads of the test server go to a folder of their own, emptied each run.
  const uploadsDir = resolve('.data/test-uploads')
  rmSync(uploadsDir, { recursive: true, force: true })

  // The test run's own mail fake, on a free port, with its own folder.
  const mailDir = fileURLToPath(new URL('../../.data/mail-test', import.meta.url))
  rmSync(mailDir, { recursive: true, force: true })
  const mail = await startMailFake({ port: 0, dir: mailDir })

  const { baseUrl, stop } = await startBuiltServer({
    SMTP_URL: `smtp://127.0.0.1:${mail.port}`,
    MAIL_DIR: mailDir,
    MAIL_FAKE: '1',
    NUXT_PUBLIC_MAIL_PAGE: '1',
    DATABASE_URL: databaseUrl,
    UPLOADS_DRIVER: 'fs',
    UPLOADS_DIR: uploadsDir,
    NUXT_TRUST_PROXY: '1',
    NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD ?? 'test-session-password-of-at-least-32-chars',
  })

  project.provide('baseUrl', baseUrl)
  project.provide('databaseUrl', databaseUrl)
  project.provide('other', other)
  project.provide('uploadsDir', uploadsDir)

  project.provide('mailDir', mailDir)

  return async () => {
    await stop()
    await mail.stop()
  }
}
