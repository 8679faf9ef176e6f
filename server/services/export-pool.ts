// A fixed pool of worker threads for export files and other costly work
// (sheet plans, label sheets, plate figures), so none of it holds up other
// requests on the server's event loop. Jobs queue by group (a shop), first in,
// first out within a group, the groups taking turns: a shop with many jobs
// waiting never keeps another shop's one job from the next free worker. A
// worker that dies fails only its own job and is replaced.
import { availableParallelism } from 'node:os'
import { Worker } from 'node:worker_threads'
import type { ExportJob } from './export-jobs'
import type { WorkerReply, WorkerRequest } from '../workers/export-worker'

export interface ExportFailure { statusCode: number; statusMessage?: string; message: string; data?: unknown }

/** A job that ended in an error the client should see (422 and such), carried back from the worker. */
export class ExportJobError extends Error {
  constructor(readonly failure: ExportFailure) {
    super(failure.message)
  }
}

interface Task { job: ExportJob; resolve: (body: Uint8Array | string) => void; reject: (err: unknown) => void }
interface Slot { worker: Worker; task: Task | null; id: number; timer?: ReturnType<typeof setTimeout>; timedOut?: boolean }

/** The longest one file may take before its worker is stopped: far past the 200-sheet cap's few seconds. */
export const EXPORT_JOB_TIMEOUT_MS = 120_000

/** Workers for a machine of `cores` cores: one core is left to the event loop (and PostgreSQL), at least one worker. */
export function defaultPoolSize(cores = availableParallelism()): number {
  return Math.max(1, Math.min(cores - 1, 8))
}

export class ExportPool {
  private slots: Slot[] = []
  /** Waiting jobs by group, in the order the groups take turns. */
  private queues = new Map<string, Task[]>()
  private nextId = 1
  private closed = false

  constructor(readonly file: string, readonly size: number, readonly timeoutMs = EXPORT_JOB_TIMEOUT_MS) {}

  /** Jobs waiting for a free worker. */
  get waiting(): number {
    let n = 0
    for (const q of this.queues.values()) n += q.length
    return n
  }
  /** Jobs of one group waiting for a free worker. */
  waitingFor(group: string): number { return this.queues.get(group)?.length ?? 0 }
  /** Groups with jobs waiting. */
  get groupsWaiting(): number { return this.queues.size }
  /** Jobs being written now. */
  get running(): number { return this.slots.filter(s => s.task).length }

  /** `group` names whose turn the job waits for (a shop); jobs of one group run in order. */
  run(job: ExportJob, group = ''): Promise<Uint8Array | string> {
    if (this.closed) return Promise.reject(new Error('The export pool is closed'))
    return new Promise((resolve, reject) => {
      const queue = this.queues.get(group)
      if (queue) queue.push({ job, resolve, reject })
      else this.queues.set(group, [{ job, resolve, reject }])
      this.pump()
    })
  }

  /** The next job: the first of the group whose turn it is; that group then goes to the back of the line. */
  private next(): Task | undefined {
    const first = this.queues.entries().next()
    if (first.done) return undefined
    const [group, queue] = first.value
    const task = queue.shift()!
    this.queues.delete(group)
    if (queue.length) this.queues.set(group, queue)
    return task
  }

  /**
   * Starts every worker now rather than at its first job: loading the
   * bundle (a few MB of code) is then done when the server starts, not while
   * a member waits, and the first costly request finds its worker ready.
   */
  warm(): void {
    while (!this.closed && this.slots.length < this.size) this.spawn()
  }

  async close(): Promise<void> {
    this.closed = true
    for (const queue of this.queues.values()) for (const task of queue) task.reject(new Error('The export pool is closed'))
    this.queues.clear()
    await Promise.all(this.slots.map(s => s.worker.terminate()))
    this.slots = []
  }

  private pump(): void {
    while (this.queues.size > 0) {
      const slot = this.slots.find(s => !s.task) ?? (this.slots.length < this.size ? this.spawn() : undefined)
      if (!slot) return
      const task = this.next()!
      slot.task = task
      slot.id = this.nextId++
      const request: WorkerRequest = { id: slot.id, job: task.job }
      slot.worker.postMessage(request)
      // A job that never ends would hold its worker for ever: stop the thread, fail the job, start another.
      slot.timer = setTimeout(() => {
        slot.timedOut = true
        void slot.worker.terminate()
      }, this.timeoutMs)
      slot.timer.unref()
    }
  }

  private spawn(): Slot {
    const worker = new Worker(this.file)
    // Idle workers must not keep a finished process (a test run, a script) alive.
    worker.unref()
    const slot: Slot = { worker, task: null, id: 0 }
    worker.on('message', (reply: WorkerReply) => {
      const task = slot.task
      if (!task || reply.id !== slot.id) return
      clearTimeout(slot.timer)
      slot.task = null
      if (reply.ok) task.resolve(reply.body)
      else task.reject(new ExportJobError(reply.error))
      this.pump()
    })
    const lost = (err: unknown) => {
      this.slots = this.slots.filter(s => s !== slot)
      const task = slot.task
      slot.task = null
      clearTimeout(slot.timer)
      if (slot.timedOut) task?.reject(new ExportJobError({ statusCode: 503, statusMessage: 'Service Unavailable', message: `This file took longer than ${Math.round(this.timeoutMs / 1000)} s to make and was stopped. Try fewer sheets (a larger paper or a roll).` }))
      else task?.reject(err instanceof Error ? err : new Error(`The export worker stopped (${String(err)})`))
      if (!this.closed) this.pump()
    }
    worker.on('error', lost)
    worker.on('exit', code => lost(new Error(`The export worker exited with code ${code}`)))
    this.slots.push(slot)
    return slot
  }
}
