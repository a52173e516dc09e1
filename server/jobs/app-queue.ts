/**
 * The app's side of the simulation queue: one started pg-boss per server process (memoised, on
 * a small pool of its own), used to send a run's job inside the transaction that creates the
 * run and to cancel it. The app never works jobs and runs no pg-boss maintenance (the workers
 * do).
 */
import type PgBoss from 'pg-boss'
import pg from 'pg'
import type { Transaction } from 'sequelize'
import { createBoss, transactionExecutor } from './boss'
import { SIMULATION_JOB_OPTIONS, SIMULATION_QUEUE, ensureSimulationQueue, type SimulationJob } from './queue'

let pending: Promise<PgBoss> | undefined

async function start(databaseUrl: string): Promise<PgBoss> {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2, application_name: 'tributary-queue', connectionTimeoutMillis: 5_000 })
  pool.on('error', error => console.error('[jobs] idle queue connection failed:', error.message))
  const boss = createBoss(pool, { supervise: false })
  boss.on('error', error => console.error('[jobs] queue error:', error instanceof Error ? error.message : error))
  try {
    await boss.start()
    await ensureSimulationQueue(boss)
  } catch (error) {
    await pool.end().catch(() => {})
    throw error
  }
  return boss
}

/**
 * The app's started pg-boss (created on first use; a failed start is forgotten so the next
 * call tries again).
 *
 * @param databaseUrl - the app's database (runtimeConfig.databaseUrl)
 */
export function appQueue(databaseUrl: string): Promise<PgBoss> {
  if (!pending) {
    pending = start(databaseUrl).catch((error: unknown) => {
      pending = undefined
      throw error
    })
  }
  return pending
}

/**
 * Sends the job of run `runId` inside `transaction` (it exists only if the transaction commits).
 *
 * @returns the pg-boss job id
 */
export async function sendRunJob(boss: PgBoss, transaction: Transaction, runId: number): Promise<string> {
  const job: SimulationJob = { runId }
  const id = await boss.send(SIMULATION_QUEUE, job, { ...SIMULATION_JOB_OPTIONS, db: transactionExecutor(transaction) })
  if (!id) throw new Error(`The simulation job of run ${runId} was not created`)
  return id
}

/** Cancels the job of a run inside `transaction` (no-op when the job already finished). */
export async function cancelRunJob(boss: PgBoss, transaction: Transaction, jobId: string): Promise<void> {
  await boss.cancel(SIMULATION_QUEUE, jobId, { db: transactionExecutor(transaction) })
}
