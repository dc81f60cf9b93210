import type { EntityManager } from 'typeorm'

export type TaskName = 'send-mail' | (string & {})

export interface JobOptions {
  runAt?: Date
  /** Jobs with the same key replace one another until they run: how batched mail is coalesced. */
  jobKey?: string
  maxAttempts?: number
  queueName?: string
}

/**
 * Adds a job to the PostgreSQL queue (graphile-worker) through the caller's transaction, so the job
 * exists exactly when the change that caused it is committed.
 */
export async function enqueueJob(manager: EntityManager, task: TaskName, payload: object, options: JobOptions = {}) {
  await manager.query(`SELECT graphile_worker.add_job($1, $2::json, queue_name => $3, run_at => $4, max_attempts => $5, job_key => $6)`, [
    task,
    JSON.stringify(payload),
    options.queueName ?? null,
    options.runAt ?? null,
    options.maxAttempts ?? 12,
    options.jobKey ?? null,
  ])
}
