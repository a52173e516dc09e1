/**
 * Serves the built app (.output) on PORT/HOST with one process per core (node:cluster; the
 * processes share the listening socket and the primary hands out connections in turn).
 * Everything the app keeps between requests is in PostgreSQL (sessions are sealed cookies; the
 * in-memory session cache and the e-mail dispatcher are safe per process), so any process can
 * answer any request. A process that dies is replaced. SIGTERM / SIGINT stop them all.
 *
 * TRIBUTARY_SERVER_PROCESSES sets the number (default: the machine's cores; 1 = no cluster).
 */
import cluster from 'node:cluster'
import { availableParallelism } from 'node:os'

const requested = Number.parseInt(process.env.TRIBUTARY_SERVER_PROCESSES ?? '', 10)
const processes = Number.isInteger(requested) && requested > 0 ? requested : Math.max(1, availableParallelism())
const server = new URL('../.output/server/index.mjs', import.meta.url)

if (processes === 1 || !cluster.isPrimary) {
  await import(server.href)
} else {
  let stopping = false
  const recentDeaths = []
  for (let i = 0; i < processes; i++) cluster.fork()
  cluster.on('exit', (worker, code, signal) => {
    if (stopping) return
    const now = Date.now()
    recentDeaths.push(now)
    while (recentDeaths.length > 0 && now - recentDeaths[0] > 60_000) recentDeaths.shift()
    if (recentDeaths.length > 5 * processes) {
      console.error('[serve] app processes keep exiting; stopping.')
      process.exit(1)
    }
    console.error(`[serve] app process ${worker.process.pid} exited (${signal ?? code}); starting another`)
    cluster.fork()
  })
  const stop = (signal) => {
    if (stopping) return
    stopping = true
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill(signal)
    const timer = setTimeout(() => process.exit(0), 10_000)
    timer.unref()
    cluster.on('exit', () => {
      if (Object.values(cluster.workers ?? {}).every(worker => !worker || worker.isDead())) process.exit(0)
    })
  }
  process.once('SIGTERM', () => stop('SIGTERM'))
  process.once('SIGINT', () => stop('SIGINT'))
}
