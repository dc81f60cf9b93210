// The engine's asynchronous task queue: every write answers 202 with a summarized task, then runs
// in order, going enqueued → processing → succeeded | failed, so that the SDK's `waitTask()` and
// `waitForTask()` poll it exactly as they poll the real engine.

import { EngineError, engineErrors, type EngineErrorBody } from './errors'

export type TaskType =
  'indexCreation' | 'indexUpdate' | 'indexDeletion' | 'settingsUpdate' | 'documentAdditionOrUpdate' | 'documentDeletion'

export type TaskStatus = 'enqueued' | 'processing' | 'succeeded' | 'failed' | 'canceled'

export interface Task {
  uid: number
  batchUid: number | null
  indexUid: string | null
  status: TaskStatus
  type: TaskType
  canceledBy: number | null
  details: Record<string, unknown>
  error: EngineErrorBody | null
  duration: string | null
  enqueuedAt: string
  startedAt: string | null
  finishedAt: string | null
  customMetadata?: string
}

export interface EnqueuedTask {
  taskUid: number
  indexUid: string | null
  status: 'enqueued'
  type: TaskType
  enqueuedAt: string
}

/** Runs the task's work; returns the details to publish on success (it may adjust `task.details` before failing). */
export type TaskWork = (task: Task) => Record<string, unknown> | void

/** ISO 8601 duration as the engine prints it, e.g. `PT0.004588S`. */
function isoDuration(milliseconds: number): string {
  return `PT${(milliseconds / 1000).toFixed(6)}S`
}

export class TaskQueue {
  private readonly tasks: Task[] = []
  private readonly work = new Map<number, TaskWork>()
  private running = false
  private closed = false

  enqueue(
    type: TaskType,
    indexUid: string | null,
    details: Record<string, unknown>,
    work: TaskWork,
    customMetadata?: string,
  ): EnqueuedTask {
    const task: Task = {
      uid: this.tasks.length,
      batchUid: null,
      indexUid,
      status: 'enqueued',
      type,
      canceledBy: null,
      details,
      error: null,
      duration: null,
      enqueuedAt: new Date().toISOString(),
      startedAt: null,
      finishedAt: null,
      ...(customMetadata === undefined ? {} : { customMetadata }),
    }
    this.tasks.push(task)
    this.work.set(task.uid, work)
    this.schedule()
    return { taskUid: task.uid, indexUid, status: 'enqueued', type, enqueuedAt: task.enqueuedAt }
  }

  get(uid: number): Task {
    const task = this.tasks[uid]
    if (!task) throw engineErrors.taskNotFound(String(uid))
    return task
  }

  /** GET /tasks: newest first, with the engine's filters and `from`/`next` paging. */
  list(query: URLSearchParams): { results: Task[]; total: number; limit: number; from: number | null; next: number | null } {
    const listOf = (name: string): string[] | null => {
      const value = query.get(name)
      if (value === null || value === '*') return null
      return value.split(',').map((part) => part.trim())
    }
    const limit = query.has('limit') ? Number(query.get('limit')) : 20
    const from = query.has('from') ? Number(query.get('from')) : null
    if (!Number.isInteger(limit) || limit < 0) {
      throw engineErrors.invalid(
        'invalid_task_limit',
        `Invalid value in parameter \`limit\`: could not parse \`${query.get('limit')}\` as a positive integer`,
      )
    }
    const uids = listOf('uids')
    const statuses = listOf('statuses')
    const types = listOf('types')
    const indexUids = listOf('indexUids')
    const reverse = query.get('reverse') === 'true'
    const matching = this.tasks.filter(
      (task) =>
        (!uids || uids.includes(String(task.uid))) &&
        (!statuses || statuses.includes(task.status)) &&
        (!types || types.includes(task.type)) &&
        (!indexUids || (task.indexUid !== null && indexUids.includes(task.indexUid))),
    )
    const ordered = reverse ? matching : [...matching].reverse()
    const startAt = from === null ? 0 : ordered.findIndex((task) => (reverse ? task.uid >= from : task.uid <= from))
    const page = startAt === -1 ? [] : ordered.slice(startAt, startAt + limit)
    const following = startAt === -1 ? undefined : ordered[startAt + limit]
    return { results: page, total: matching.length, limit, from: page[0]?.uid ?? null, next: following?.uid ?? null }
  }

  /** Whether some task of this index still waits or runs (for index stats). */
  isIndexing(indexUid: string): boolean {
    return this.tasks.some((task) => task.indexUid === indexUid && (task.status === 'enqueued' || task.status === 'processing'))
  }

  close(): void {
    this.closed = true
  }

  /** Takes work again after close(), running whatever was left enqueued. */
  reopen(): void {
    this.closed = false
    this.schedule()
  }

  private schedule(): void {
    if (this.running || this.closed) return
    const next = this.tasks.find((task) => task.status === 'enqueued')
    if (!next) return
    this.running = true
    next.status = 'processing'
    next.batchUid = next.uid
    next.startedAt = new Date().toISOString()
    const started = performance.now()
    // One turn of the event loop in `processing`, so pollers can observe it as with the engine.
    setImmediate(() => {
      const work = this.work.get(next.uid)!
      this.work.delete(next.uid)
      try {
        const details = work(next)
        if (details) next.details = details
        next.status = 'succeeded'
      } catch (error) {
        next.status = 'failed'
        next.error = error instanceof EngineError ? error.toBody() : new EngineError(500, 'internal', String(error), 'internal').toBody()
      }
      next.finishedAt = new Date().toISOString()
      next.duration = isoDuration(performance.now() - started)
      this.running = false
      this.schedule()
    })
  }
}
