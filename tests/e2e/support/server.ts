import { spawn } from 'node:child_process'
import { existsSync } from 'node:fs'
import { createServer } from 'node:net'
import { fileURLToPath } from 'node:url'

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.once('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address()
      srv.close(() => (addr && typeof addr === 'object' ? resolve(addr.port) : reject(new Error('no port'))))
    })
  })
}

/**
 * Starts the built server (`.output`) on a free port on 127.0.0.1 and waits
 * until it answers; `stop` ends it. Used by the e2e set-up and the benchmarks.
 */
export async function startBuiltServer(env: Record<string, string>): Promise<{ baseUrl: string; stop: () => Promise<void> }> {
  const root = fileURLToPath(new URL('../../..', import.meta.url))
  const entry = `${root}.output/server/index.mjs`
  if (!existsSync(entry)) throw new Error('No build found: run `npm test` (it builds), or `npx nuxt build` first')
  const port = await freePort()
  const baseUrl = `http://127.0.0.1:${port}`
  let output = ''
  const child = spawn(process.execPath, [entry], {
    cwd: root,
    // Links in mail and share answers are built from APP_URL: the address the tests use.
    env: { ...process.env, APP_URL: baseUrl, ...env, PORT: String(port), HOST: '127.0.0.1' },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout?.on('data', (d: Buffer) => { output += d.toString() })
  child.stderr?.on('data', (d: Buffer) => { output += d.toString() })
  const stop = async () => {
    if (child.exitCode !== null) return
    child.kill('SIGTERM')
    await new Promise(r => child.once('exit', r))
  }
  const deadline = Date.now() + 60_000
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the server exited early:\n${output}`)
    const up = await fetch(`${baseUrl}/api/designs`).then(r => r.status === 401, () => false)
    if (up) return { baseUrl, stop }
    await new Promise(r => setTimeout(r, 200))
  }
  await stop()
  throw new Error(`the server did not answer within 60 s:\n${output}`)
}
