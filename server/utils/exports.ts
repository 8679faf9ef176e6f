import { fileURLToPath } from 'node:url'
import { dirname } from 'node:path'
import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import { getRevision } from '../services/designs'
import type { BuildSheetRevision } from '../services/build-sheet'
import type { ExportJob } from '../services/export-jobs'
import { ExportJobError, ExportPool, defaultPoolSize } from '../services/export-pool'
import { ExportRunner, ExportsBusyError, ExportsQueueFullError, findWorkerFile, type ExportOwner } from '../services/export-runner'
import { shares } from '../database/schema'
import type { Member } from './auth'

/** The revision named in the route (of the member's shop), as the export jobs take it; 404 otherwise. */
export async function exportRevision(event: H3Event, member: Member): Promise<BuildSheetRevision> {
  const revision = await getRevision(useDb(), member.shopId, routeId(event))
  if (!revision) throw notFound('That revision')
  return { number: revision.number, params: revision.params, designName: revision.designName, sizeLabel: revision.sizeLabel, createdAt: revision.createdAt, author: revision.author.name }
}

/** The template font, shipped with the server as a Nitro server asset. */
export async function templateFont(): Promise<Uint8Array> {
  const raw = await useStorage('assets:fonts').getItemRaw<Buffer | Uint8Array>('ibm-plex-sans-latin-400-normal.woff')
  if (!raw) throw createError({ statusCode: 500, message: 'The template font is missing from the server build' })
  return raw instanceof Uint8Array ? raw : new Uint8Array(raw)
}

export function sendFile(event: H3Event, body: Uint8Array | string, type: string, filename: string) {
  setResponseHeaders(event, {
    'content-type': type,
    'content-disposition': `attachment; filename="${filename}"`,
    'cache-control': 'no-store',
  })
  return body
}

let runner: ExportRunner | null = null

/**
 * The server's one export runner. `EXPORT_WORKERS` sets the pool's size
 * (default: one worker per core); `EXPORT_WORKERS=0`, or no bundled worker
 * (`nuxt dev`), makes the files in the server's own thread.
 */
export function exportRunner(): ExportRunner {
  if (runner) return runner
  const wanted = process.env.EXPORT_WORKERS === undefined || process.env.EXPORT_WORKERS === '' ? defaultPoolSize() : Number(process.env.EXPORT_WORKERS)
  // Before the entry module has run (a plugin at start-up), Nitro's import.meta.url
  // is a stand-in; the entry's own path (process.argv[1]) finds the bundle then.
  const file = process.env.EXPORT_WORKER_FILE || findWorkerFile(dirname(fileURLToPath(import.meta.url))) || (process.argv[1] ? findWorkerFile(dirname(process.argv[1]), 0) : null)
  const size = Number.isInteger(wanted) && wanted > 0 ? wanted : 0
  const pool = file && size > 0 ? new ExportPool(file, size) : null
  runner = new ExportRunner({ pool, buildStamp: useRuntimeConfig().app.buildId || 'dev' })
  return runner
}

/** Who a member's costly request counts against: the member, in the member's shop's turn. */
export function memberOwner(member: Member): ExportOwner {
  return { key: `member:${member.userId}`, shop: member.shopId }
}

/**
 * Who a job counts against. A share link's downloads count against the member
 * who made the link (one member's many links share that member's limit), in
 * the link's shop's turn; a link whose maker has left counts as its shop's.
 */
async function resolveOwner(event: H3Event, owner: string | ExportOwner): Promise<ExportOwner> {
  if (typeof owner !== 'string') return owner
  if (owner.startsWith('share:')) {
    const [row] = await useDb().select({ createdBy: shares.createdBy, shopId: shares.shopId }).from(shares).where(eq(shares.id, owner.slice('share:'.length)))
    if (!row) throw notFound('That share')
    return { key: row.createdBy ? `member:${row.createdBy}` : `shop-links:${row.shopId}`, shop: row.shopId }
  }
  const member = event.context.member
  return { key: owner, shop: member?.shopId ?? owner }
}

/**
 * Runs one costly job (an export file, a sheet plan, a label sheet, plate
 * figures) through the server's runner: from the cache, or on the worker
 * pool within the owner's limit. A busy owner is a 429, a full queue a 503,
 * both with Retry-After.
 */
export async function runCostly(event: H3Event, job: ExportJob, owner: string | ExportOwner) {
  try {
    return await exportRunner().run(job, await resolveOwner(event, owner))
  }
  catch (err: unknown) {
    if (err instanceof ExportsBusyError) {
      setResponseHeader(event, 'retry-after', err.retryAfter)
      throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: err.message, data: { retryAfter: err.retryAfter } })
    }
    if (err instanceof ExportsQueueFullError) {
      setResponseHeader(event, 'retry-after', err.retryAfter)
      throw createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: err.message, data: { retryAfter: err.retryAfter } })
    }
    if (err instanceof ExportJobError) throw createError(err.failure)
    throw err
  }
}

/**
 * Makes (or takes from the cache) one export file and sends it. `owner` names
 * who waits for it (`member:<id>`, `share:<id>`, counted against the member
 * who made the link): each member may have only a few in the making at once.
 * `X-Rootplate-Cache` says whether the file was made now.
 */
export async function sendExport(event: H3Event, job: ExportJob, owner: string | ExportOwner, type: string, filename: string) {
  const { body, cache, madeBy } = await runCostly(event, job, owner)
  setResponseHeader(event, 'x-rootplate-cache', cache)
  if (madeBy) setResponseHeader(event, 'x-rootplate-made-by', madeBy)
  return sendFile(event, body, type, filename)
}
