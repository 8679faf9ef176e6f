// Accounts benchmark (issue 25): how long an unrelated member's GET /api/me
// waits while one address guesses a password two times a second (goal: p95
// under 50 ms, worst under 250 ms), whether the owner's right password gets
// in meanwhile, and how long POST /api/auth/forgot takes to answer for an
// address with an account and for one without (goal: the same, within noise).
// Prints figures; never fails.
// Run: npm run bench (it builds and starts the database), or
//   npx nuxt build && npx tsx scripts/bench/accounts-load.ts
import { performance } from 'node:perf_hooks'
import { applyMigrations } from '../migrate'
import { runSeed } from '../seed'
import { databaseUrl } from '../../server/utils/db'
import { recreateDatabase, withDatabase } from '../../tests/e2e/support/fixtures'
import { startBuiltServer } from '../../tests/e2e/support/server'

const P95_GOAL_MS = 50
const WORST_GOAL_MS = 250
const ATTACK_SECONDS = Number(process.env.BENCH_SECONDS ?? 14)

const base = databaseUrl()
// The name ends in _test: recreateDatabase drops only such databases.
const benchUrl = withDatabase(base, `${new URL(base).pathname.slice(1) || 'rootplate'}_accounts_bench_test`)
await recreateDatabase(benchUrl)
await applyMigrations(benchUrl)
await runSeed(benchUrl)

const percentile = (values: number[], p: number) => {
  const s = [...values].sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)] ?? Number.NaN
}
const pause = (ms: number) => new Promise(r => setTimeout(r, ms))
let n = 0
const address = () => { n++; return `203.0.113.${n % 250}` }

const { baseUrl, stop } = await startBuiltServer({
  DATABASE_URL: benchUrl,
  NUXT_TRUST_PROXY: '1',
  NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD ?? 'bench-session-password-of-at-least-32-chars',
})
const login = (email: string, password: string, from: string) => fetch(`${baseUrl}/api/auth/login`, {
  method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': from }, body: JSON.stringify({ email, password }),
})
try {
  const watcherRes = await login('lead@rootplate.test', 'rootplate-demo', address())
  const watcher = watcherRes.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  const victim = 'viewer@rootplate.test'
  const attacker = '198.18.0.1'

  // 1. The slow guesser.
  let done = false
  const waits: number[] = []
  const watch = (async () => {
    while (!done) {
      const s = performance.now()
      const res = await fetch(`${baseUrl}/api/me`, { headers: { cookie: watcher } })
      await res.text()
      waits.push(performance.now() - s)
      await pause(20)
    }
  })()
  const guesses: Promise<number>[] = []
  const owner: number[] = []
  const t0 = performance.now()
  while (performance.now() - t0 < ATTACK_SECONDS * 1000) {
    guesses.push(login(victim, `guess-${guesses.length}`, attacker).then(r => r.text().then(() => r.status)))
    if (owner.length < 2 && performance.now() - t0 > (owner.length ? 12_000 : 9_000)) {
      const s = performance.now()
      const r = await login(victim, 'rootplate-demo', address())
      await r.text()
      owner.push(r.status)
      console.log(`owner's right password after ${((s - t0) / 1000).toFixed(1)} s of guessing: ${r.status} in ${(performance.now() - s).toFixed(0)} ms`)
    }
    await pause(500)
  }
  const statuses = await Promise.all(guesses)
  done = true
  await watch
  const p95 = percentile(waits, 95)
  const worst = Math.max(...waits)
  console.log(`guesses: ${statuses.length} (${statuses.filter(s => s === 429).length} answered 429, ${statuses.filter(s => s === 401).length} 401)`)
  console.log(`GET /api/me during the guessing: ${waits.length} requests, median ${percentile(waits, 50).toFixed(1)} ms, p95 ${p95.toFixed(1)} ms (goal < ${P95_GOAL_MS}, ratio ${(p95 / P95_GOAL_MS).toFixed(2)}), worst ${worst.toFixed(1)} ms (goal < ${WORST_GOAL_MS}, ratio ${(worst / WORST_GOAL_MS).toFixed(2)})`)
  console.log(`owner signed in: ${owner.every(s => s === 200) ? 'yes' : 'NO'} (${owner.join(', ')})`)

  // 2. Forgot password: answer times for an address with and without an account, interleaved.
  const times: Record<'known' | 'unknown', number[]> = { known: [], unknown: [] }
  for (let i = 0; i < 60; i++) {
    for (const kind of ['known', 'unknown'] as const) {
      const email = kind === 'known' ? 'designer@rootplate.test' : `nobody-${i}@rootplate.test`
      const s = performance.now()
      const r = await fetch(`${baseUrl}/api/auth/forgot`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': address() }, body: JSON.stringify({ email }) })
      await r.text()
      times[kind].push(performance.now() - s)
    }
  }
  const k = percentile(times.known, 50)
  const u = percentile(times.unknown, 50)
  console.log(`forgot-password answer, median: known ${k.toFixed(2)} ms, unknown ${u.toFixed(2)} ms (goal: equal; difference ${(k - u).toFixed(2)} ms); p95 known ${percentile(times.known, 95).toFixed(2)} ms, unknown ${percentile(times.unknown, 95).toFixed(2)} ms`)
}
finally {
  await stop()
}
