import { Logger as WorkerLogger, run, runMigrations, type Runner, type TaskList } from 'graphile-worker'
import type { Pool } from 'pg'
import type { PostgresDriver } from 'typeorm/driver/postgres/PostgresDriver.js'
import type { AppContext } from '../context'
import { PAYOUT_SWEEP_TASK } from '../services/payouts'
import { REQUEST_SWEEP_TASK, taskList } from './tasks'

export function poolOf(ctx: AppContext): Pool {
  return (ctx.db.driver as PostgresDriver).master as Pool
}

const quietLogger = (ctx: AppContext) =>
  new WorkerLogger(() => (level, message) => {
    if (level === 'error') ctx.log.error(`queue: ${message}`)
    else if (level === 'warning') ctx.log.warn(`queue: ${message}`)
  })

/** The queue's own tables (schema graphile_worker); safe to run on every start. */
export async function migrateQueue(ctx: AppContext) {
  await runMigrations({ pgPool: poolOf(ctx), logger: quietLogger(ctx) })
}

/** Starts a worker in this process. Several processes may run one: jobs are taken with SKIP LOCKED. */
export async function startWorker(ctx: AppContext, tasks: TaskList = taskList(ctx)): Promise<Runner> {
  return run({
    pgPool: poolOf(ctx),
    concurrency: ctx.config.workerConcurrency,
    noHandleSignals: true,
    pollInterval: 1000,
    logger: quietLogger(ctx),
    taskList: tasks,
    // What dates alone make stale is swept every ten minutes, and studios' payouts past their hold
    // every fifteen (graphile-worker's crontab: one run per slot across all workers, and a missed slot
    // after downtime is caught up once).
    ...(tasks[REQUEST_SWEEP_TASK]
      ? {
          crontab: [
            `*/10 * * * * ${REQUEST_SWEEP_TASK} ?fill=1h`,
            ...(tasks[PAYOUT_SWEEP_TASK] ? [`*/15 * * * * ${PAYOUT_SWEEP_TASK} ?fill=1h`] : []),
          ].join('\n'),
        }
      : {}),
  })
}
