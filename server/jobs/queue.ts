/**
 * The simulation job queue, shared by the app (which sends jobs) and the worker process (which
 * works them): queue name, retry and expiry policy, and the job payload.
 *
 * pg-boss 10 keeps jobs in its own schema (`pgboss`) of the app's database; a queue must be
 * created (`ensureSimulationQueue`) before the first `send`. The payload carries only the run's
 * id: everything a run needs (model, parameters, seed, replicates) is read from its
 * `simulation_runs` row, so a retried job runs exactly what was asked.
 *
 * Liveness: pg-boss 10 has no heartbeat of its own, so the worker keeps one on the run row
 * (`heartbeat_at`, every few seconds) and a watchdog in every worker fails the job of a run
 * whose heartbeat is older than the lease (worker/watchdog.ts); pg-boss then retries it
 * (up to RUN_RETRY_LIMIT times). The queue's expiry is only a backstop for that.
 */
import type PgBoss from 'pg-boss'
import { z } from 'zod'

/** Name of the pg-boss queue of simulation runs. */
export const SIMULATION_QUEUE = 'simulation-runs'

/** Retries of a job after its worker stopped or failed (so at most 1 + this many attempts). */
export const RUN_RETRY_LIMIT = 2

/** Attempts a run may take before it is marked failed. */
export const MAXIMUM_RUN_ATTEMPTS = RUN_RETRY_LIMIT + 1

/** Seconds between a failure and the retry. */
export const RUN_RETRY_DELAY_SECONDS = 1

/**
 * Backstop expiry of an active job, seconds (pg-boss allows less than 24 h). The heartbeat
 * watchdog notices a dead worker long before; this also bounds the longest run.
 */
export const RUN_EXPIRE_SECONDS = 23 * 60 * 60

/** The job payload. */
export const SimulationJobSchema = z.strictObject({
  runId: z.number().int().min(1),
})
export type SimulationJob = z.output<typeof SimulationJobSchema>

/** Options of every simulation job (the same as the queue's, in case the queue predates them). */
export const SIMULATION_JOB_OPTIONS = {
  retryLimit: RUN_RETRY_LIMIT,
  retryDelay: RUN_RETRY_DELAY_SECONDS,
  retryBackoff: false,
  expireInSeconds: RUN_EXPIRE_SECONDS,
} as const

/**
 * Creates the simulation queue if it does not exist (idempotent; safe from several processes).
 *
 * @param boss - a started pg-boss instance
 */
export async function ensureSimulationQueue(boss: PgBoss): Promise<void> {
  await boss.createQueue(SIMULATION_QUEUE, {
    name: SIMULATION_QUEUE,
    policy: 'standard',
    ...SIMULATION_JOB_OPTIONS,
  })
}
