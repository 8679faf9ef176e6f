// Issue 15, "database away": the project's PostgreSQL is stopped and started
// again inside the test run. While it is away every API route answers 503
// with a JSON message (RFC 9110 15.6.4: the server is temporarily unable to
// handle the request), the app says so and keeps unsaved work; once it is
// back, the same server answers normally, without a restart, and nothing
// saved before is lost.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { count, eq } from 'drizzle-orm'
import type { Browser } from 'playwright-core'
import { createDatabase } from '../../server/utils/db'
import { revisions } from '../../server/database/schema'
import { api, demo, signIn } from './support/api'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { cluster } from './support/cluster'
import { plateDefaults } from './support/plate'
import { recreateDatabase, withDatabase } from './support/fixtures'
import { startBuiltServer } from './support/server'
import postgres from 'postgres'

const shots = 'test-results/e2e'
let designer: string
let designId: string
let browser: Browser

async function revisionCount(): Promise<number> {
  // A fresh connection each time: the cluster goes away in between.
  const db = createDatabase(inject('databaseUrl'))
  try {
    const [row] = await db.select({ n: count() }).from(revisions).where(eq(revisions.designId, designId))
    return row!.n
  }
  finally {
    await db.$client.end()
  }
}

async function waitForDatabase(cookie: string) {
  await expect.poll(async () => (await api('/api/designs', { cookie })).status, { timeout: 30_000, interval: 250 }).toBe(200)
}

beforeAll(async () => {
  designer = await signIn(demo.designer)
  const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Database-away test trunk', params: plateDefaults() } })
  expect(created.status).toBe(201)
  designId = created.body.id
  browser = await launchChromium()
})

afterAll(async () => {
  // Whatever happened above, leave the cluster running for the files after this one.
  cluster('start', inject('databaseUrl'))
  await browser?.close()
})

describe('the database stopped and started again', () => {
  it('API routes answer 503 with a JSON message while it is away, then normally again; nothing is lost', async () => {
    const designRes = await api(`/api/designs/${designId}`, { cookie: designer })
    const base = designRes.body.latest.number as number
    expect(await revisionCount()).toBe(1)

    cluster('stop', inject('databaseUrl'))
    try {
      const cases = [
        await api('/api/designs', { cookie: designer }),
        await api(`/api/designs/${designId}`, { cookie: designer }),
        await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: designer, body: { params: plateDefaults(), note: 'while away', basedOn: base } }),
        await api('/api/me', { cookie: designer }),
        await api('/api/auth/login', { method: 'POST', body: { email: demo.viewer, password: 'rootplate-demo' } }),
        await api('/api/health'),
      ]
      for (const res of cases) {
        expect(res.status).toBe(503)
        expect(res.headers.get('content-type')).toMatch(/json/)
        expect(res.body.message).toMatch(/cannot reach its database/)
        expect(res.body.data.code).toBe('database-unavailable')
      }
    }
    finally {
      cluster('start', inject('databaseUrl'))
    }

    await waitForDatabase(designer)
    expect((await api('/api/health')).status).toBe(200)
    // The refused save stored nothing; the revision from before is still there.
    expect(await revisionCount()).toBe(1)
    const save = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: designer, body: { params: plateDefaults(), note: 'after the database came back', basedOn: base } })
    expect(save.status).toBe(201)
    expect(save.body.number).toBe(base + 1)
    expect(await revisionCount()).toBe(2)
  })

  it('in Chromium the editor says the database is away, keeps the unsaved change, and saves it once it is back', async () => {
    const base = inject('baseUrl')
    // Only the 503 answers of the outage are expected (and the browser's own log line for each); any other
    // console error, uncaught exception, failed request or error answer fails the test.
    const page = watchPage(await browser.newPage({ viewport: { width: 1280, height: 800 } }), [/^answer 503: /, /^console error: Failed to load resource: the server responded with a status of 503/])
    await page.goto(`${base}/login`)
    await page.getByLabel('E-mail').fill(demo.designer)
    await page.getByLabel('Password').fill('rootplate-demo')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${base}/`)
    await page.getByRole('link', { name: 'Database-away test trunk' }).click()
    await page.getByTestId('plate-canvas').waitFor()
    await page.getByText('Preparing the drawing…').waitFor({ state: 'detached' })

    const tube = page.getByRole('textbox', { name: 'Tube diameter', exact: true })
    await tube.fill('17-1/2"')
    await tube.press('Enter')
    await page.getByText('Unsaved changes', { exact: true }).waitFor()
    const before = await revisionCount()

    cluster('stop', inject('databaseUrl'))
    try {
      await page.getByLabel('Note for this revision').fill('Saved across an outage')
      await page.getByTestId('save').click()
      await page.getByTestId('database-away').waitFor()
      expect(await page.getByTestId('database-away').textContent()).toContain('Rootplate cannot reach its database; your unsaved changes are kept in this tab.')
      expect(await tube.inputValue()).toBe('17-1/2"')
      expect(await page.getByText('Unsaved changes', { exact: true }).isVisible()).toBe(true)
      await page.screenshot({ path: `${shots}/database-away.png` })
    }
    finally {
      cluster('start', inject('databaseUrl'))
    }

    // The banner checks by itself every few seconds and goes once the database answers.
    await page.getByTestId('database-away').waitFor({ state: 'detached', timeout: 30_000 })
    expect(await tube.inputValue()).toBe('17-1/2"')
    await page.getByTestId('save').click()
    await page.getByText('Unsaved changes', { exact: true }).waitFor({ state: 'detached' })
    expect(await revisionCount()).toBe(before + 1)
    const latest = await api(`/api/designs/${designId}`, { cookie: designer })
    // 17-1/2 in = 444.5 mm (1 in = 25.4 mm exactly, NIST SP 811).
    expect(latest.body.latest.params.tubeDiameter).toBeCloseTo(444.5, 6)
    expect(latest.body.latest.note).toBe('Saved across an outage')
    await page.close()
    expect(takePageProblems()).toEqual([])
  })

  it('a server pointed at a database without Rootplate\'s migrations refuses to start and says how to fix it', async () => {
    const empty = withDatabase(inject('databaseUrl'), `rootplate_unmigrated_${process.pid}_test`)
    await recreateDatabase(empty)
    try {
      const started = await startBuiltServer({ DATABASE_URL: empty, NUXT_SESSION_PASSWORD: 'test-session-password-of-at-least-32-chars' }).then(
        async (s) => { await s.stop(); return 'started' },
        (err: unknown) => String(err),
      )
      expect(started).toMatch(/refusing to serve/)
      expect(started).toMatch(/does not carry Rootplate's migrations/)
      expect(started).toMatch(/npm run db:migrate/)
    }
    finally {
      const admin = postgres(withDatabase(inject('databaseUrl'), 'postgres'), { max: 1, onnotice: () => {} })
      await admin.unsafe(`drop database if exists "${new URL(empty).pathname.slice(1)}" with (force)`)
      await admin.end()
    }
  })
})
