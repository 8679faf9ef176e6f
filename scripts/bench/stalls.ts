// Stall benchmark (issue 25 items 1, 2 and 4): how long an unrelated member's
// GET /api/me waits while (a) signed-out senders post 4,000-deep JSON to
// sign-in, (b) one member asks over and over for costly work (sheet plans,
// label sheets, a show's plates) and (c) forty senders trickle bodies a byte
// a second. Goal (issue 25): p95 under 50 ms, worst under 250 ms. Prints
// figures; never fails.
// Run: npm run bench (it builds and starts the database), or
//   npx nuxt build && npx tsx scripts/bench/stalls.ts
import { connect, type Socket } from 'node:net'
import { availableParallelism, loadavg } from 'node:os'
import { performance } from 'node:perf_hooks'
import { applyMigrations } from '../migrate'
import { runSeed } from '../seed'
import { databaseUrl } from '../../server/utils/db'
import { deriveForTube, presetParams } from '../../geometry'
import { recreateDatabase, withDatabase } from '../../tests/e2e/support/fixtures'
import { startBuiltServer } from '../../tests/e2e/support/server'

const P95_GOAL_MS = 50
const WORST_GOAL_MS = 250
const PHASE_MS = 8_000
const IN = 25.4
const SHEET = { width: 48 * IN, height: 96 * IN, thickness: 0.703 * IN, margin: 0.5 * IN, kerf: 0.25 * IN }

const base = databaseUrl()
// The name ends in _test: recreateDatabase drops only such databases.
const benchUrl = withDatabase(base, `${new URL(base).pathname.slice(1) || 'rootplate'}_stalls_bench_test`)
await recreateDatabase(benchUrl)
await applyMigrations(benchUrl)
await runSeed(benchUrl)

function percentile(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)] ?? Number.NaN
}

let address = 0
/** A client address of its own per sign-in (RFC 5737 documentation range), so the sign-in limiter never mixes them. */
const nextAddress = () => `203.0.113.${(address++ % 250) + 1}`

async function signIn(baseUrl: string, email: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': nextAddress() }, body: JSON.stringify({ email, password: 'rootplate-demo' }) })
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}`)
  return res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
}

async function json(baseUrl: string, path: string, cookie: string, body: unknown) {
  const res = await fetch(`${baseUrl}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', cookie }, body: JSON.stringify(body) })
  if (res.status !== 201) throw new Error(`${path} answered ${res.status}: ${await res.text()}`)
  return res.json() as Promise<{ id: string }>
}

/** GET /api/me for the watcher, over and over, until `until` resolves; the waits in ms. */
async function watch(baseUrl: string, cookie: string, until: Promise<unknown>): Promise<number[]> {
  let done = false
  void until.finally(() => { done = true })
  const waits: number[] = []
  while (!done) {
    const s = performance.now()
    const res = await fetch(`${baseUrl}/api/me`, { headers: { cookie } })
    await res.text()
    if (res.status !== 200) throw new Error(`GET /api/me answered ${res.status}`)
    waits.push(performance.now() - s)
    await new Promise(r => setTimeout(r, 10))
  }
  return waits
}

/** Keeps `workers` loops calling `send` until the phase ends; counts the answers by status. */
async function attack(workers: number, send: (i: number) => Promise<number>): Promise<Map<number, number>> {
  const statuses = new Map<number, number>()
  const end = performance.now() + PHASE_MS
  let i = 0
  await Promise.all(Array.from({ length: workers }, async () => {
    while (performance.now() < end) {
      const status = await send(i++)
      statuses.set(status, (statuses.get(status) ?? 0) + 1)
    }
  }))
  return statuses
}

function report(label: string, waits: number[], statuses: Map<number, number>) {
  const p95 = percentile(waits, 95)
  const worst = Math.max(...waits)
  const answers = [...statuses].map(([s, n]) => `${n} x ${s}`).join(', ')
  console.log(`${label}: attack answers ${answers}`)
  console.log(`${label}: GET /api/me x${waits.length}: median ${percentile(waits, 50).toFixed(1)} ms, p95 ${p95.toFixed(1)} ms (goal < ${P95_GOAL_MS}: ${p95 < P95_GOAL_MS ? 'met' : 'not met'}), worst ${worst.toFixed(1)} ms (goal < ${WORST_GOAL_MS}: ${worst < WORST_GOAL_MS ? 'met' : 'not met'})`)
}

const { baseUrl, stop } = await startBuiltServer({
  DATABASE_URL: benchUrl,
  NUXT_TRUST_PROXY: '1',
  NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD ?? 'bench-session-password-of-at-least-32-chars',
})
try {
  console.log(`load average before: ${loadavg().map(l => l.toFixed(2)).join(' ')} on ${availableParallelism()} cores (a shared machine makes every figure noisy)`)
  const watcher = await signIn(baseUrl, 'viewer@rootplate.test')
  const designer = await signIn(baseUrl, 'designer@rootplate.test')
  const builder = await signIn(baseUrl, 'builder@rootplate.test')

  // The costly member's material: a show of three sizes of one shape, and 60 units.
  const show = await json(baseUrl, '/api/shows', designer, { name: 'Stall bench hollow' })
  const designIds: string[] = []
  for (const tube of [10.5, 12.5, 14.5]) {
    const d = await json(baseUrl, '/api/designs', designer, { name: `Stall bench boulder ${tube}`, showId: show.id, params: deriveForTube(presetParams('river-stone')!, tube * IN) })
    designIds.push(d.id)
  }
  const unitIds: string[] = []
  for (let i = 0; i < 60; i++) unitIds.push((await json(baseUrl, '/api/units', builder, { kind: 'pattern', label: `Stall bench ${i}` })).id)

  // Warm the routes (first-request set-up is not what is measured).
  for (let i = 0; i < 20; i++) await fetch(`${baseUrl}/api/me`, { headers: { cookie: watcher } }).then(r => r.text())
  const idle = await (async () => {
    const out: number[] = []
    for (let i = 0; i < 30; i++) {
      const s = performance.now()
      await fetch(`${baseUrl}/api/me`, { headers: { cookie: watcher } }).then(r => r.text())
      out.push(performance.now() - s)
    }
    return out
  })()
  console.log(`idle: GET /api/me median ${percentile(idle, 50).toFixed(1)} ms, p95 ${percentile(idle, 95).toFixed(1)} ms`)

  // (a) Signed out, four senders at once: 4,000 nested arrays (8 kB) to sign-in.
  const deep = `${'['.repeat(4000)}${']'.repeat(4000)}`
  const deepAttack = attack(4, () => fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': nextAddress() }, body: deep }).then(async (r) => { await r.text(); return r.status }))
  report('deep JSON (4 senders, 4,000 deep)', await watch(baseUrl, watcher, deepAttack), await deepAttack)

  // (b) One member, four requests at a time: sheet plans (never the same twice), label sheets, the show page.
  let n = 0
  const costlyAttack = attack(4, async (i) => {
    const kind = i % 3
    let res: Response
    if (kind === 0) {
      n++
      const counts = [1 + (n % 10), 1 + ((n >> 1) % 10), 1 + ((n >> 2) % 10)]
      res = await fetch(`${baseUrl}/api/sheet-plans`, { method: 'POST', headers: { 'content-type': 'application/json', cookie: designer }, body: JSON.stringify({ items: designIds.map((designId, k) => ({ designId, count: counts[k] })), sheet: { ...SHEET, kerf: 3 + (n % 50) / 10 }, workflow: 'panels' }) })
    }
    else if (kind === 1) res = await fetch(`${baseUrl}/api/units/labels.pdf?ids=${unitIds.slice(0, 20 + (i % 40)).join(',')}`, { headers: { cookie: designer } })
    else res = await fetch(`${baseUrl}/api/shows/${show.id}`, { headers: { cookie: designer } })
    await res.arrayBuffer()
    return res.status
  })
  report('costly work (1 member, 4 at a time)', await watch(baseUrl, watcher, costlyAttack), await costlyAttack)

  // (c) Forty senders trickling a sign-in body, a byte a second.
  const { hostname, port } = new URL(baseUrl)
  const slow: Promise<number>[] = []
  const sockets: Socket[] = []
  for (let i = 0; i < 40; i++) {
    slow.push(new Promise((resolve) => {
      const socket = connect(Number(port), hostname)
      sockets.push(socket)
      let reply = ''
      const timer = setInterval(() => socket.writable && socket.write('a'), 1000)
      socket.on('connect', () => socket.write(`POST /api/auth/login HTTP/1.1\r\nHost: ${hostname}:${port}\r\nContent-Type: application/json\r\nContent-Length: 4000\r\nX-Forwarded-For: ${nextAddress()}\r\n\r\n{`))
      socket.on('data', (d: Buffer) => { reply += d.toString() })
      socket.on('error', () => {})
      socket.on('close', () => {
        clearInterval(timer)
        resolve(Number(/^HTTP\/1\.1 (\d+)/.exec(reply)?.[1] ?? 0))
      })
    }))
  }
  const slowDone = Promise.race([Promise.all(slow), new Promise(r => setTimeout(r, 30_000))])
  const slowWaits = await watch(baseUrl, watcher, slowDone)
  for (const s of sockets) s.destroy()
  const slowStatuses = new Map<number, number>()
  for (const status of await Promise.all(slow)) slowStatuses.set(status, (slowStatuses.get(status) ?? 0) + 1)
  report('slow senders (40, a byte a second; 0 = still open after 30 s)', slowWaits, slowStatuses)
}
finally {
  await stop()
}
process.exit(0)
