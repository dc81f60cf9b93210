import type { EntityManager } from 'typeorm'

export type TaskName = 'send-mail' | (string & {})

export interface JobOptions {
  runAt?: Date
  /** Jobs with the same key replace one another until they run: how batched mail is coalesced. */
  jobKey?: string
  maxAttempts?: number
  queueName?: string
  /** With a jobKey: 'preserve_run_at' keeps a waiting job's time instead of moving it. */
  jobKeyMode?: 'replace' | 'preserve_run_at'
}

/**
 * Adds a job to the PostgreSQL queue (graphile-worker) through the caller's transaction, so the job
 * exists exactly when the change that caused it is committed.
 */
export async function enqueueJob(manager: EntityManager, task: TaskName, payload: object, options: JobOptions = {}) {
  await manager.query(
    `SELECT graphile_worker.add_job($1, $2::json, queue_name => $3, run_at => $4, max_attempts => $5, job_key => $6, job_key_mode => $7)`,
    [
      task,
      JSON.stringify(payload),
      options.queueName ?? null,
      options.runAt ?? null,
      options.maxAttempts ?? 12,
      options.jobKey ?? null,
      options.jobKeyMode ?? 'replace',
    ],
  )
}

/** Runs every waiting job of a task now, with its attempts counted afresh (after an outage they waited out). */
export async function runWaitingJobsNow(manager: Pick<EntityManager, 'query'>, task: TaskName): Promise<number> {
  const rows: unknown[] = await manager.query(
    `SELECT * FROM graphile_worker.reschedule_jobs(
       ARRAY(SELECT id FROM graphile_worker.jobs WHERE task_identifier = $1 AND locked_at IS NULL),
       run_at => now(), attempts => 0::smallint)`,
    [task],
  )
  return rows.length
}
