import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync } from 'node:fs'
import { createServer } from 'node:net'
import { fileURLToPath } from 'node:url'
import type { TestProject } from 'vitest/node'
import { applyMigrations } from '../../scripts/migrate'
import { hasher, runSeed } from '../../scripts/seed'
import { recreateDatabase, seedOtherShop, testDatabaseUrl } from './support/fixtures'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
    databaseUrl: string
    other: { designId: string; revisionId: string }
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.once('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address()
      srv.close(() => (addr && typeof addr === 'object' ? resolve(addr.port) : reject(new Error('no port'))))
    })
  })
}

async function waitForServer(url: string, child: ChildProcess, log: () => string): Promise<void> {
  const deadline = Date.now() + 60_000
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the test server exited early:\n${log()}`)
    try {
      const res = await fetch(`${url}/api/designs`)
      if (res.status === 401) return
    }
    catch {
      // not listening yet
    }
    await new Promise(r => setTimeout(r, 200))
  }
  throw new Error(`the test server did not answer within 60 s:\n${log()}`)
}

/**
 * One built server for every e2e file, on a fresh test database holding the
 * demo shop and a second shop. `npm test` builds first; run it, not vitest alone.
 */
export default async function setup(project: TestProject) {
  const root = fileURLToPath(new URL('../..', import.meta.url))
  const entry = `${root}.output/server/index.mjs`
  if (!existsSync(entry)) throw new Error('No build found: run `npm test` (it builds), or `npx nuxt build` first')

  const databaseUrl = testDatabaseUrl()
  await recreateDatabase(databaseUrl)
  await applyMigrations(databaseUrl)
  await runSeed(databaseUrl)
  const other = await seedOtherShop(databaseUrl, p => hasher.make(p))

  const port = await freePort()
  let output = ''
  const child = spawn(process.execPath, [entry], {
    cwd: root,
    env: {
      ...process.env,
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: databaseUrl,
      NUXT_TRUST_PROXY: '1',
      NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD ?? 'test-session-password-of-at-least-32-chars',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout?.on('data', (d: Buffer) => { output += d.toString() })
  child.stderr?.on('data', (d: Buffer) => { output += d.toString() })
  const baseUrl = `http://127.0.0.1:${port}`
  await waitForServer(baseUrl, child, () => output)

  project.provide('baseUrl', baseUrl)
  project.provide('databaseUrl', databaseUrl)
  project.provide('other', other)

  return async () => {
    child.kill('SIGTERM')
    await new Promise(r => child.once('exit', r))
  }
}
