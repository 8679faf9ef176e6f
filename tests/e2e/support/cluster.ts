import { execFileSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'

const root = fileURLToPath(new URL('../../..', import.meta.url))

/**
 * Stops or starts the project's PostgreSQL cluster that holds the test
 * database, through scripts/db.sh on the test database's own port.
 */
export function cluster(command: 'stop' | 'start', databaseUrl: string): string {
  const port = new URL(databaseUrl).port
  return execFileSync('bash', ['scripts/db.sh', command], {
    cwd: root,
    env: { ...process.env, PG_PORT: port },
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'pipe'],
    timeout: 90_000,
  })
}

/** Runs an npm script of the project and returns its stdout. */
export function npmRun(script: string, args: string[], env: Record<string, string>): string {
  return execFileSync('npm', ['run', '-s', script, ...(args.length ? ['--', ...args] : [])], {
    cwd: root,
    env: { ...process.env, ...env },
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'pipe'],
    timeout: 120_000,
  })
}
