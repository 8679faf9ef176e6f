// Export load benchmark (issue 17): how long an unrelated request (GET /api/me)
// waits while 8 large templates are being made at once, with the files made
// in the server's own thread (EXPORT_WORKERS=0, as before the pool) and on the
// worker pool. Goal: under 50 ms (issue 17). Prints figures; never fails.
// Run: npm run bench (it builds and starts the database), or
//   npx nuxt build && npx tsx scripts/bench/export-load.ts
import { availableParallelism, loadavg } from 'node:os'
import { performance } from 'node:perf_hooks'
import { applyMigrations } from '../migrate'
import { runSeed } from '../seed'
import { databaseUrl } from '../../server/utils/db'
import { recreateDatabase, withDatabase } from '../../tests/e2e/support/fixtures'
import { startBuiltServer } from '../../tests/e2e/support/server'

const GOAL_MS = 50
const EXPORTS = 8
// Our own bench shape: a 49 in tube with twelve long roots, about 2.6 m across: 134 Letter sheets.
const LARGE = { tubeDiameter: 1244.6, casterCount: 8, casterOffset: 1000, lobes: { count: 12, reach: 600, width: 600, valley: 100, irregularity: 0, roundness: 1 } }
const MEMBERS = ['lead', 'designer', 'builder', 'viewer'].map(r => `${r}@rootplate.test`)

const base = databaseUrl()
// The name ends in _test: recreateDatabase drops only such databases.
const benchUrl = withDatabase(base, `${new URL(base).pathname.slice(1) || 'rootplate'}_export_bench_test`)
await recreateDatabase(benchUrl)
await applyMigrations(benchUrl)
await runSeed(benchUrl)

function percentile(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)] ?? Number.NaN
}

async function signIn(baseUrl: string, email: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: 'rootplate-demo' }) })
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}`)
  return res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
}

async function measure(label: string, workers: string | undefined) {
  const { baseUrl, stop } = await startBuiltServer({
    DATABASE_URL: benchUrl,
    NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD ?? 'bench-session-password-of-at-least-32-chars',
    ...(workers === undefined ? {} : { EXPORT_WORKERS: workers }),
  })
  try {
    const cookies = await Promise.all(MEMBERS.map(m => signIn(baseUrl, m)))
    const watcher = await signIn(baseUrl, MEMBERS[1]!)
    const created = await fetch(`${baseUrl}/api/designs`, { method: 'POST', headers: { 'content-type': 'application/json', cookie: cookies[1]! }, body: JSON.stringify({ name: `Export bench ${label}`, params: LARGE }) })
    if (created.status !== 201) throw new Error(`creating the design answered ${created.status}`)
    const revisionId = ((await created.json()) as { revision: { id: string } }).revision.id
    // Warm the routes once (first-request set-up is not what is measured), with a query not used below.
    await fetch(`${baseUrl}/api/revisions/${revisionId}/template.pdf?paper=letter&overlap=1`, { headers: { cookie: cookies[0]! } }).then(r => r.arrayBuffer())
    await fetch(`${baseUrl}/api/me`, { headers: { cookie: watcher } }).then(r => r.text())

    const idle: number[] = []
    for (let i = 0; i < 20; i++) {
      const s = performance.now()
      await fetch(`${baseUrl}/api/me`, { headers: { cookie: watcher } }).then(r => r.text())
      idle.push(performance.now() - s)
    }
    let done = false
    const t0 = performance.now()
    // Two per member (the per-member limit), each a different query so none is cached or joined.
    const exports = Array.from({ length: EXPORTS }, (_, i) =>
      fetch(`${baseUrl}/api/revisions/${revisionId}/template.pdf?paper=letter&overlap=${20 + i}`, { headers: { cookie: cookies[i % cookies.length]! } })
        .then(async r => ({ status: r.status, bytes: (await r.arrayBuffer()).byteLength, ms: performance.now() - t0 })))
    const all = Promise.all(exports).finally(() => { done = true })
    const waits: number[] = []
    while (!done) {
      const s = performance.now()
      const res = await fetch(`${baseUrl}/api/me`, { headers: { cookie: watcher } })
      await res.text()
      if (res.status !== 200) throw new Error(`GET /api/me answered ${res.status}`)
      waits.push(performance.now() - s)
      await new Promise(r => setTimeout(r, 10))
    }
    const results = await all
    const failed = results.filter(r => r.status !== 200)
    if (failed.length) throw new Error(`exports answered ${failed.map(f => f.status).join(', ')}`)
    const worst = Math.max(...waits)
    const p95 = percentile(waits, 95)
    console.log(`${label}: GET /api/me with nothing else running: median ${percentile(idle, 50).toFixed(1)} ms`)
    console.log(`${label}: ${EXPORTS} templates of ${(results[0]!.bytes / 1e6).toFixed(2)} MB in ${(Math.max(...results.map(r => r.ms)) / 1000).toFixed(1)} s; GET /api/me x${waits.length}: median ${percentile(waits, 50).toFixed(1)} ms, p95 ${p95.toFixed(1)} ms, worst ${worst.toFixed(1)} ms`)
    return { p95, worst }
  }
  finally {
    await stop()
  }
}

console.log(`load average before: ${loadavg().map(l => l.toFixed(2)).join(' ')} on ${availableParallelism()} cores (a shared machine makes every figure noisy)`)
const before = await measure('in-thread (EXPORT_WORKERS=0)', '0')
const after = await measure('worker pool', undefined)
console.log(`goal: GET /api/me under ${GOAL_MS} ms while ${EXPORTS} large exports run`)
console.log(`worst wait: before ${before.worst.toFixed(1)} ms, after ${after.worst.toFixed(1)} ms (${(before.worst / after.worst).toFixed(1)}x less); p95 after ${after.p95.toFixed(1)} ms: goal ${after.p95 < GOAL_MS ? 'met' : 'not met'} (p95), ${after.worst < GOAL_MS ? 'met' : 'not met'} (worst)`)
process.exit(0)
