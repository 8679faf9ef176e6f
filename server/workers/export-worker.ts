// The export worker thread: takes a job, writes the file, posts it back.
// Bundled on its own by esbuild into .output/server/export-worker.mjs (see
// nuxt.config.ts), so it must not use Nitro's auto-imports.
import { readlinkSync } from 'node:fs'
import { setPriority } from 'node:os'
import { parentPort } from 'node:worker_threads'
import { runExportJob, type ExportJob } from '../services/export-jobs'

export interface WorkerRequest { id: number; job: ExportJob }
export type WorkerReply =
  | { id: number; ok: true; body: Uint8Array | string }
  | { id: number; ok: false; error: { statusCode: number; statusMessage?: string; message: string; data?: unknown } }

if (!parentPort) throw new Error('export-worker must run as a worker thread')
const port = parentPort

// Linux schedules threads one by one: this worker thread (not the server's
// event loop) is niced, so short requests still get a core while files are
// written. /proc/thread-self names the calling thread; elsewhere nothing changes.
try {
  const tid = Number(readlinkSync('/proc/thread-self').split('/').pop())
  if (Number.isInteger(tid) && tid > 0) setPriority(tid, 10)
}
catch { /* not Linux, or not allowed: the worker runs at normal priority */ }

port.on('message', async ({ id, job }: WorkerRequest) => {
  try {
    const body = await runExportJob(job)
    const reply: WorkerReply = { id, ok: true, body }
    port.postMessage(reply, typeof body === 'string' ? [] : [body.buffer as ArrayBuffer])
  }
  catch (err: unknown) {
    const e = err as { statusCode?: number; statusMessage?: string; message?: string; data?: unknown }
    const statusCode = typeof e?.statusCode === 'number' ? e.statusCode : 500
    const reply: WorkerReply = {
      id,
      ok: false,
      error: {
        statusCode,
        statusMessage: e?.statusMessage,
        message: statusCode >= 500 ? `The export failed: ${e?.message ?? String(err)}` : (e?.message ?? 'The export failed'),
        data: e?.data,
      },
    }
    port.postMessage(reply)
  }
})
