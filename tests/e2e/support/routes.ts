import { readdirSync } from 'node:fs'
import { join, relative } from 'node:path'
import { fileURLToPath } from 'node:url'

export interface ApiRoute { method: string; template: string }

/** Every route file (`name.method.ts`) under server/api, as a method and a path with `[param]` holes, sorted by path then method. */
export function apiRoutes(): ApiRoute[] {
  const apiDir = fileURLToPath(new URL('../../../server/api', import.meta.url))
  const out: ApiRoute[] = []
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = join(dir, entry.name)
      if (entry.isDirectory()) { walk(full); continue }
      const m = /^(.*)\.(get|post|put|patch|delete)\.ts$/.exec(entry.name)
      if (!m) continue
      const rel = relative(apiDir, join(dir, m[1]!)).split('/').filter(s => s !== 'index')
      out.push({ method: m[2]!.toUpperCase(), template: `/api/${rel.join('/')}`.replace(/\/$/, '') })
    }
  }
  walk(apiDir)
  return out.sort((a, b) => `${a.template} ${a.method}`.localeCompare(`${b.template} ${b.method}`))
}
