/**
 * The simulation worker: a separate Node process (`npm run worker`; `npm start` starts one)
 * that works the pg-boss queue of simulation runs on the app's PostgreSQL database, one run at
 * a time, with the replicates of each run spread over a pool of worker threads. Several workers
 * may run, on several machines, against one database: pg-boss hands each job to one of them.
 *
 *   NUXT_DATABASE_URL=postgres://… TRIBUTARY_WORKER_THREADS=4 npm run worker
 *
 * Settings: worker/config.ts. Stop with SIGTERM or Ctrl+C: the run in progress goes back to the
 * queue (its job is retried by pg-boss, by this worker later or by another one) and the process
 * exits. A worker killed outright (SIGKILL, power cut) stops sending heartbeats; the watchdog of
 * any other worker — or of the next one started — notices after the lease and the job is
 * retried. Either way the retried run gives the same result: each replicate's random stream
 * depends only on the seed and the replicate's index.
 */
import pg from 'pg'
import { createBoss } from '../server/jobs/boss'
import { SIMULATION_QUEUE, ensureSimulationQueue } from '../server/jobs/queue'
import { workerConfig } from './config'
import { ReplicatePool } from './replicate-pool'
import { handleRunJob, type JobContext } from './run-job'
import { startWatchdog } from './watchdog'

/** host:port/database of a connection URL, without the password. */
function describeDatabaseUrl(url: string): string {
  try {
    const parsed = new URL(url)
    return `${parsed.hostname}:${parsed.port || '5432'}${parsed.pathname}`
  } catch {
    return 'an unparsable database URL'
  }
}

const log = (message: string): void => {
  console.log(`${new Date().toISOString()} [worker ${process.pid}] ${message}`)
}

async function main(): Promise<void> {
  const config = workerConfig()
  const db = new pg.Pool({ connectionString: config.databaseUrl, max: 5, application_name: 'tributary-worker', connectionTimeoutMillis: 10_000 })
  db.on('error', error => log(`idle database connection failed: ${error.message}`))
  try {
    await db.query('SELECT 1 FROM simulation_runs LIMIT 0')
  } catch (error) {
    log(`cannot use ${describeDatabaseUrl(config.databaseUrl)}: ${error instanceof Error ? error.message : String(error)} (is PostgreSQL running, and have migrations run? npm run db:migrate)`)
    await db.end()
    process.exitCode = 1
    return
  }

  const boss = createBoss(db, { supervise: true, maintenanceIntervalSeconds: config.maintenanceSeconds })
  boss.on('error', error => log(`queue error: ${error instanceof Error ? error.message : String(error)}`))
  await boss.start()
  await ensureSimulationQueue(boss)

  const pool = new ReplicatePool(config.threads)
  const shutdown = new AbortController()
  const context: JobContext = { db, pool, config, shutdown: shutdown.signal, log }
  const stopWatchdog = startWatchdog(db, boss, config.leaseSeconds, log)

  await boss.work(SIMULATION_QUEUE, { batchSize: 1, pollingIntervalSeconds: config.pollSeconds }, async (jobs) => {
    for (const job of jobs) await handleRunJob(context, job)
  })
  log(`working queue "${SIMULATION_QUEUE}" on ${describeDatabaseUrl(config.databaseUrl)} with ${config.threads} thread${config.threads === 1 ? '' : 's'} (lease ${config.leaseSeconds} s)`)

  let stopping = false
  const stop = async (signal: string) => {
    if (stopping) return
    stopping = true
    log(`${signal}: stopping`)
    stopWatchdog()
    shutdown.abort()
    try {
      // Waits for the handler (which gives the run back and throws, so pg-boss retries the job).
      await boss.stop({ graceful: true, wait: true, timeout: 15_000 })
    } catch (error) {
      log(`queue stop failed: ${String(error)}`)
    }
    await pool.destroy().catch(() => {})
    await db.end().catch(() => {})
    log('stopped')
    process.exit(0)
  }
  process.on('SIGTERM', () => void stop('SIGTERM'))
  process.on('SIGINT', () => void stop('SIGINT'))
}

main().catch((error: unknown) => {
  log(`failed to start: ${error instanceof Error ? error.stack ?? error.message : String(error)}`)
  process.exit(1)
})
