// The mutation check (npm run mutate): each break in ./breaks.ts is applied
// alone, the narrowest tests that should notice it are run, and the file is
// put back byte for byte, whatever happens (also on Ctrl+C). A break is
// "caught" when those tests fail. Breaks of code the built server runs
// (server/, shared/, and geometry/ behind an API test) rebuild it first.
// The score is printed last; misses are listed with the reason kept beside
// each break. The run never changes a file for good: a break whose text is
// not found exactly once is reported as stale, not applied.
import { spawnSync } from 'node:child_process'
import { readFileSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { BREAKS, type Break } from './breaks'

const root = fileURLToPath(new URL('../..', import.meta.url))
const args = process.argv.slice(2)
const flag = (name: string) => {
  const i = args.indexOf(name)
  return i >= 0 ? args[i + 1] : undefined
}

if (args.includes('--list')) {
  for (const b of BREAKS) console.log(`${b.id.padEnd(34)} ${b.area.padEnd(10)} ${b.file}  [${b.tests.join(' ')}]`)
  process.exit(0)
}

const only = flag('--only')?.split(',').map(s => s.trim()).filter(Boolean)
const chosen = only ? BREAKS.filter(b => only.includes(b.id)) : BREAKS
if (only && chosen.length !== only.length) {
  const known = new Set(BREAKS.map(b => b.id))
  console.error(`mutate: unknown break ${only.filter(id => !known.has(id)).join(', ')} (npm run mutate -- --list)`)
  process.exit(2)
}

// Refuse to run over uncommitted work in a file a break touches: putting the
// file back restores what was read, but a crash of this machine would not.
const dirty = spawnSync('git', ['status', '--porcelain', '--', ...new Set(chosen.map(b => b.file))], { cwd: root, encoding: 'utf8' }).stdout.trim()
if (dirty && !args.includes('--allow-dirty')) {
  console.error(`mutate: these files have uncommitted changes; commit them first (or --allow-dirty):\n${dirty}`)
  process.exit(2)
}

let restore: (() => void) | null = null
for (const sig of ['SIGINT', 'SIGTERM'] as const) {
  process.on(sig, () => {
    restore?.()
    process.exit(130)
  })
}

const needsBuild = (b: Break) => b.tests.some(t => t.startsWith('tests/e2e/'))
const built = { dirty: false }

function run(cmd: string, argv: string[], timeoutMs: number): { code: number; out: string } {
  const r = spawnSync(cmd, argv, { cwd: root, encoding: 'utf8', timeout: timeoutMs, maxBuffer: 64 * 1024 * 1024, env: { ...process.env, FORCE_COLOR: '0', NO_COLOR: '1' } })
  return { code: r.status ?? 1, out: `${r.stdout ?? ''}${r.stderr ?? ''}` }
}

function build(): boolean {
  const r = run('npx', ['nuxt', 'build'], 15 * 60_000)
  if (r.code !== 0) console.log(r.out.split('\n').slice(-20).join('\n'))
  return r.code === 0
}

type Outcome = { b: Break; result: 'caught' | 'missed' | 'stale' | 'no-build'; detail: string }
const outcomes: Outcome[] = []

for (const b of chosen) {
  const path = resolve(root, b.file)
  const original = readFileSync(path, 'utf8')
  const at = original.split(b.find).length - 1
  if (at !== 1) {
    outcomes.push({ b, result: 'stale', detail: `its text stands ${at} times in ${b.file}` })
    console.log(`stale   ${b.id}: its text stands ${at} times in ${b.file}`)
    continue
  }
  restore = () => writeFileSync(path, original)
  writeFileSync(path, original.replace(b.find, b.replace))
  try {
    if (needsBuild(b)) {
      built.dirty = true
      if (!build()) {
        // A break the build refuses is caught by the type check and build that npm test runs first.
        outcomes.push({ b, result: 'caught', detail: 'the build refused it' })
        console.log(`caught  ${b.id} (the build refused it)`)
        continue
      }
    }
    const r = run('npx', ['vitest', 'run', ...b.tests, ...(b.testName ? ['-t', b.testName] : [])], 30 * 60_000)
    // eslint-disable-next-line no-control-regex
    const plain = r.out.replace(/\x1b\[[0-9;]*m/g, '')
    const summary = plain.split('\n').filter(l => /^\s*(Tests|Test Files)\s+\d/.test(l)).map(l => l.trim()).join('; ').replace(/\s+/g, ' ')
    const result = r.code !== 0 ? 'caught' : 'missed'
    outcomes.push({ b, result, detail: summary })
    console.log(`${result.padEnd(7)} ${b.id}: ${summary}`)
  } finally {
    restore()
    restore = null
  }
}

if (built.dirty) {
  console.log('mutate: rebuilding the unbroken code')
  build()
}

const scored = outcomes.filter(o => o.result === 'caught' || o.result === 'missed')
const caught = scored.filter(o => o.result === 'caught').length
const misses = outcomes.filter(o => o.result !== 'caught')
console.log('')
for (const o of misses) console.log(`${o.result}: ${o.b.id} (${o.b.file}): ${o.b.what}${o.b.whyMissed ? ` -- known: ${o.b.whyMissed}` : ''}`)
const pct = scored.length ? (100 * caught) / scored.length : 0
console.log(`mutation score: ${caught} of ${scored.length} breaks caught (${pct.toFixed(1)} %), goal 95 %${outcomes.length > scored.length ? `; ${outcomes.length - scored.length} stale` : ''}`)
process.exit(0)
