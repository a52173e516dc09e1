/**
 * The worker's reads and writes of `simulation_runs` (plain SQL on the worker's pg Pool).
 *
 * Every write after the claim is guarded by the attempt number the claim returned
 * (`attempts = $attempt AND status = 'running'`): when a run was cancelled, or its job was
 * retried by another worker because this one looked dead, the guard fails, the write changes
 * nothing, and the caller learns it has lost the run.
 */
import type { Queryable } from '../server/jobs/boss'
import type { SimulationModel, SimulationResult } from '../shared/schemas/simulation-run'

/** A run as the worker needs it once claimed. */
export interface ClaimedRun {
  id: number
  model: SimulationModel
  parameters: unknown
  seed: number
  replicates: number
  engineVersion: string
  /** This claim's attempt number (1 for the first). */
  attempt: number
}

interface ClaimRow { id: number, model: SimulationModel, parameters: unknown, seed: string, replicates: number, engine_version: string, attempts: number }

/**
 * Claims run `runId` for this worker: queued (or running, when its previous worker died) →
 * running, attempts + 1, progress 0, fresh heartbeat.
 *
 * @returns the run, or null when it is finished, cancelled or gone (nothing to do)
 */
export async function claimRun(db: Queryable, runId: number, jobId: string, worker: string): Promise<ClaimedRun | null> {
  const { rows } = await db.query(
    `UPDATE simulation_runs
        SET status = 'running', attempts = attempts + 1, progress = 0, error = NULL,
            started_at = now(), heartbeat_at = now(), worker = $3, job_id = COALESCE(job_id, $2::uuid),
            updated_at = now(), version = version + 1
      WHERE id = $1 AND status IN ('queued', 'running')
      RETURNING id, model, parameters, seed::text AS seed, replicates, engine_version, attempts`,
    [runId, jobId, worker],
  )
  const row = rows[0] as ClaimRow | undefined
  if (!row) return null
  return {
    id: row.id, model: row.model, parameters: row.parameters, seed: Number(row.seed), replicates: row.replicates,
    engineVersion: row.engine_version, attempt: row.attempts,
  }
}

const OURS = `id = $1 AND attempts = $2 AND status = 'running'`

/** Renews the heartbeat. @returns false when the run is no longer this attempt's (cancelled or taken over). */
export async function beat(db: Queryable, run: ClaimedRun): Promise<boolean> {
  const { rows } = await db.query(`UPDATE simulation_runs SET heartbeat_at = now() WHERE ${OURS} RETURNING id`, [run.id, run.attempt])
  return rows.length === 1
}

/** Records progress (never backwards) with a heartbeat. @returns false when the run is no longer ours. */
export async function recordProgress(db: Queryable, run: ClaimedRun, progress: number): Promise<boolean> {
  const { rows } = await db.query(
    `UPDATE simulation_runs SET progress = GREATEST(progress, LEAST(1, $3::double precision)), heartbeat_at = now(), updated_at = now()
      WHERE ${OURS} RETURNING id`,
    [run.id, run.attempt, progress],
  )
  return rows.length === 1
}

/** Stores the result: running → succeeded. @returns false when the run is no longer ours. */
export async function recordResult(db: Queryable, run: ClaimedRun, result: SimulationResult): Promise<boolean> {
  const { rows } = await db.query(
    `UPDATE simulation_runs
        SET status = 'succeeded', progress = 1, result = $3::jsonb, finished_at = now(), heartbeat_at = NULL,
            updated_at = now(), version = version + 1
      WHERE ${OURS} RETURNING id`,
    // JSON has no NaN or Infinity: JSON.stringify writes them as null, which the DTOs document.
    [run.id, run.attempt, JSON.stringify(result)],
  )
  return rows.length === 1
}

/** running → failed with a message people can read. @returns false when the run is no longer ours. */
export async function recordFailure(db: Queryable, run: ClaimedRun, message: string): Promise<boolean> {
  const { rows } = await db.query(
    `UPDATE simulation_runs
        SET status = 'failed', error = $3, finished_at = now(), heartbeat_at = NULL, updated_at = now(), version = version + 1
      WHERE ${OURS} RETURNING id`,
    [run.id, run.attempt, message],
  )
  return rows.length === 1
}

/** running → queued (its job will be retried), progress back to 0. @returns false when the run is no longer ours. */
export async function requeue(db: Queryable, run: ClaimedRun): Promise<boolean> {
  const { rows } = await db.query(
    `UPDATE simulation_runs SET status = 'queued', progress = 0, heartbeat_at = NULL, worker = NULL, updated_at = now(), version = version + 1
      WHERE ${OURS} RETURNING id`,
    [run.id, run.attempt],
  )
  return rows.length === 1
}

/** The status of a run now (null when it is gone). */
export async function runStatus(db: Queryable, runId: number): Promise<string | null> {
  const { rows } = await db.query('SELECT status FROM simulation_runs WHERE id = $1', [runId])
  return (rows[0] as { status: string } | undefined)?.status ?? null
}

/** A running run whose worker stopped sending heartbeats. */
export interface StaleRun { id: number, jobId: string | null, attempt: number }

/** Running runs whose heartbeat is older than `leaseSeconds` (oldest first, at most `limit`). */
export async function staleRuns(db: Queryable, leaseSeconds: number, limit = 20): Promise<StaleRun[]> {
  const { rows } = await db.query(
    `SELECT id, job_id, attempts FROM simulation_runs
      WHERE status = 'running' AND (heartbeat_at IS NULL OR heartbeat_at < now() - make_interval(secs => $1))
      ORDER BY heartbeat_at NULLS FIRST LIMIT $2`,
    [leaseSeconds, limit],
  )
  return (rows as { id: number, job_id: string | null, attempts: number }[]).map(row => ({ id: row.id, jobId: row.job_id, attempt: row.attempts }))
}

/**
 * Releases a stale run — still stale and still at the same attempt, so two watchdogs never
 * both release it: back to queued for a retry, or failed after `maximumAttempts` attempts.
 *
 * @returns the new status, or null when someone else changed the run first
 */
export async function releaseStaleRun(db: Queryable, run: StaleRun, leaseSeconds: number, maximumAttempts: number, failure: string): Promise<'queued' | 'failed' | null> {
  const { rows } = await db.query(
    `UPDATE simulation_runs
        SET status = CASE WHEN attempts >= $4 THEN 'failed' ELSE 'queued' END,
            error = CASE WHEN attempts >= $4 THEN $5 ELSE NULL END,
            finished_at = CASE WHEN attempts >= $4 THEN now() ELSE NULL END,
            progress = CASE WHEN attempts >= $4 THEN progress ELSE 0 END,
            heartbeat_at = NULL, worker = NULL, updated_at = now(), version = version + 1
      WHERE id = $1 AND attempts = $2 AND status = 'running'
        AND (heartbeat_at IS NULL OR heartbeat_at < now() - make_interval(secs => $3))
      RETURNING status`,
    [run.id, run.attempt, leaseSeconds, maximumAttempts, failure],
  )
  return (rows[0] as { status: 'queued' | 'failed' } | undefined)?.status ?? null
}

/** Marks a queued run failed (its job can no longer run, e.g. pg-boss gave up on it). */
export async function failQueuedRun(db: Queryable, runId: number, message: string): Promise<void> {
  await db.query(
    `UPDATE simulation_runs SET status = 'failed', error = $2, finished_at = now(), updated_at = now(), version = version + 1
      WHERE id = $1 AND status = 'queued'`,
    [runId, message],
  )
}
