/**
 * The watchdog every worker runs: finds runs whose worker stopped sending heartbeats (killed,
 * machine gone, cut off from the database) for longer than the lease, puts them back in the
 * queue — or fails them after MAXIMUM_RUN_ATTEMPTS — and fails their pg-boss job so pg-boss
 * retries it (pg-boss 10 has no heartbeat of its own; its expiry is only a day-long backstop).
 * The release is guarded (same attempt, still stale), so two watchdogs never both release a run.
 */
import type PgBoss from 'pg-boss'
import type { Queryable } from '../server/jobs/boss'
import { MAXIMUM_RUN_ATTEMPTS, SIMULATION_QUEUE } from '../server/jobs/queue'
import { failQueuedRun, releaseStaleRun, staleRuns } from './run-store'

const GAVE_UP = `The worker running this simulation stopped responding ${MAXIMUM_RUN_ATTEMPTS} times; it was not retried again. Start the run again, perhaps with fewer replicates.`

/**
 * One pass of the watchdog.
 *
 * @param db - the worker's database
 * @param boss - the worker's started pg-boss
 * @param leaseSeconds - how old a heartbeat may be
 * @param log - where to say what happened
 * @returns how many runs were released
 */
export async function releaseStaleRuns(db: Queryable, boss: PgBoss, leaseSeconds: number, log: (message: string) => void): Promise<number> {
  let released = 0
  for (const run of await staleRuns(db, leaseSeconds)) {
    const status = await releaseStaleRun(db, run, leaseSeconds, MAXIMUM_RUN_ATTEMPTS, GAVE_UP)
    if (!status) continue
    released++
    log(`run ${run.id}: no heartbeat for ${leaseSeconds} s (attempt ${run.attempt}) — ${status === 'queued' ? 'job retried' : 'failed'}`)
    if (!run.jobId) continue
    await boss.fail(SIMULATION_QUEUE, run.jobId, { message: 'The worker running this job stopped sending heartbeats' })
    if (status === 'queued') {
      // pg-boss retries only while retries remain; if it gave up, the run must not wait forever.
      const job = await boss.getJobById(SIMULATION_QUEUE, run.jobId)
      if (!job || job.state === 'failed' || job.state === 'cancelled' || job.state === 'completed') await failQueuedRun(db, run.id, GAVE_UP)
    }
  }
  return released
}

/**
 * Runs `releaseStaleRuns` every lease / 2 seconds until stopped.
 *
 * @returns a function that stops the watchdog
 */
export function startWatchdog(db: Queryable, boss: PgBoss, leaseSeconds: number, log: (message: string) => void): () => void {
  let busy = false
  const timer = setInterval(() => {
    if (busy) return
    busy = true
    releaseStaleRuns(db, boss, leaseSeconds, log)
      .catch(error => log(`watchdog pass failed: ${String(error)}`))
      .finally(() => { busy = false })
  }, Math.max(500, leaseSeconds * 500))
  return () => clearInterval(timer)
}
