/**
 * One simulation job, start to finish: claim the run, run its replicates in the thread pool
 * with a heartbeat and progress on the run row, and store the result — or stop when the run is
 * cancelled, taken over or the worker shuts down.
 *
 * What pg-boss sees: the handler returns normally when there is nothing more to do for this
 * job (succeeded, failed for good, cancelled, taken over) and throws when the job should be
 * retried (an unexpected error, or this worker shutting down); pg-boss then fails the job and
 * retries it while retries remain.
 */
import type PgBoss from 'pg-boss'
import type { Queryable } from '../server/jobs/boss'
import { MAXIMUM_RUN_ATTEMPTS, SimulationJobSchema } from '../server/jobs/queue'
import { SIMULATION_ENGINE_VERSION } from '../shared/simulation/engine-version'
import type { WorkerConfig } from './config'
import { RunAborted, type ReplicatePool } from './replicate-pool'
import { beat, claimRun, recordFailure, recordProgress, recordResult, requeue, runStatus, type ClaimedRun } from './run-store'

/** What a job handler needs from the worker. */
export interface JobContext {
  db: Queryable
  pool: ReplicatePool
  config: WorkerConfig
  /** Aborted when the worker shuts down. */
  shutdown: AbortSignal
  log: (message: string) => void
}

/** Thrown to make pg-boss retry the job. */
export class RetryJob extends Error {
  constructor(message: string) {
    super(message)
    this.name = 'RetryJob'
  }
}

/** How a handled job ended, for logs and tests. */
export type JobOutcome = 'succeeded' | 'failed' | 'cancelled' | 'lost' | 'skipped'

const UNEXPECTED = 'The simulation stopped on an unexpected error several times; the worker log has the details.'

/**
 * Handles one pg-boss job of the simulation queue.
 *
 * @param context - the worker's database, thread pool, settings and shutdown signal
 * @param job - the pg-boss job ({ runId })
 * @returns how it ended
 * @throws RetryJob (or any unexpected error) when pg-boss should retry the job
 */
export async function handleRunJob(context: JobContext, job: PgBoss.Job<unknown>): Promise<JobOutcome> {
  const { db, config, log } = context
  const payload = SimulationJobSchema.safeParse(job.data)
  if (!payload.success) {
    log(`job ${job.id}: payload is not { runId } — dropped`)
    return 'skipped'
  }
  const run = await claimRun(db, payload.data.runId, job.id, config.name)
  if (!run) {
    log(`run ${payload.data.runId}: nothing to do (finished, cancelled or deleted)`)
    return 'skipped'
  }
  if (run.engineVersion !== SIMULATION_ENGINE_VERSION) {
    await recordFailure(db, run, `This run was made for simulation engine ${run.engineVersion}; this worker has ${SIMULATION_ENGINE_VERSION}, which could give a different result. Start the run again.`)
    log(`run ${run.id}: engine version ${run.engineVersion} ≠ ${SIMULATION_ENGINE_VERSION} — failed`)
    return 'failed'
  }
  log(`run ${run.id}: started (attempt ${run.attempt}, ${run.model}, ${run.replicates} replicates, seed ${run.seed}, ${context.pool.threads} threads)`)
  return execute(context, run)
}

async function execute(context: JobContext, run: ClaimedRun): Promise<JobOutcome> {
  const { db, pool, config, log } = context
  const stop = new AbortController()
  // Why the run stopped early (an object, because callbacks set it while we await).
  const stopped: { reason: 'cancelled' | 'lost' | 'shutdown' | null } = { reason: null }
  const halt = (why: 'cancelled' | 'lost' | 'shutdown') => {
    stopped.reason ??= why
    stop.abort()
  }
  const onShutdown = () => halt('shutdown')
  context.shutdown.addEventListener('abort', onShutdown, { once: true })
  if (context.shutdown.aborted) halt('shutdown')

  /** The run is no longer this attempt's: find out whether it was cancelled. */
  const lostRun = async () => halt((await runStatus(db, run.id).catch(() => null)) === 'cancelled' ? 'cancelled' : 'lost')

  // Heartbeat (and cancel check) while the blocks run; a failed write is retried at the next beat.
  const heartbeat = setInterval(() => {
    beat(db, run).then(ours => (ours ? undefined : lostRun())).catch(error => log(`run ${run.id}: heartbeat failed: ${String(error)}`))
  }, config.heartbeatSeconds * 1000)
  // Progress writes go one after another, so they reach the row in order.
  let progressWrites: Promise<unknown> = Promise.resolve()
  const onProgress = (completed: number, total: number) => {
    progressWrites = progressWrites
      .then(() => recordProgress(db, run, completed / total))
      .then(ours => (ours ? undefined : lostRun()))
      .catch(error => log(`run ${run.id}: progress write failed: ${String(error)}`))
  }

  try {
    const started = Date.now()
    const result = await pool.run({ model: run.model, parameters: run.parameters, seed: run.seed, replicates: run.replicates }, { signal: stop.signal, onProgress })
    await progressWrites
    // Cancelled or taken over meanwhile: the guarded write changes nothing. A shutdown that comes
    // after the last block still stores the finished result.
    if (!(await recordResult(db, run, result))) {
      await lostRun()
      log(`run ${run.id}: finished but was ${stopped.reason ?? 'lost'} meanwhile — result not stored`)
      return stopped.reason === 'cancelled' ? 'cancelled' : 'lost'
    }
    log(`run ${run.id}: succeeded in ${((Date.now() - started) / 1000).toFixed(1)} s`)
    return 'succeeded'
  } catch (error) {
    await progressWrites
    if (error instanceof RunAborted || stopped.reason) {
      if (stopped.reason === 'shutdown') {
        await requeueOrFail(context, run, 'The worker running this simulation was stopped too many times.')
        log(`run ${run.id}: stopped by worker shutdown — job will be retried`)
        throw new RetryJob('The worker shut down while the run was in progress')
      }
      log(`run ${run.id}: ${stopped.reason === 'cancelled' ? 'cancelled' : 'taken over by another attempt'} — stopped`)
      return stopped.reason === 'cancelled' ? 'cancelled' : 'lost'
    }
    if (error instanceof RangeError) {
      // A domain error: the parameters were checked when the run was queued, so this is the
      // engine refusing them after all; retrying cannot help.
      await recordFailure(db, run, `The simulation engine refused the parameters: ${error.message}`)
      log(`run ${run.id}: failed: ${error.message}`)
      return 'failed'
    }
    log(`run ${run.id}: unexpected error (attempt ${run.attempt}): ${error instanceof Error ? error.stack ?? error.message : String(error)}`)
    await requeueOrFail(context, run, UNEXPECTED)
    throw error
  } finally {
    clearInterval(heartbeat)
    context.shutdown.removeEventListener('abort', onShutdown)
  }
}

/** Back to queued for pg-boss's retry, or failed when this was the last attempt. */
async function requeueOrFail(context: JobContext, run: ClaimedRun, lastAttemptMessage: string): Promise<void> {
  try {
    if (run.attempt >= MAXIMUM_RUN_ATTEMPTS) await recordFailure(context.db, run, lastAttemptMessage)
    else await requeue(context.db, run)
  } catch (error) {
    // The watchdog of another worker will release the run once its heartbeat is stale.
    context.log(`run ${run.id}: could not release the run: ${String(error)}`)
  }
}
