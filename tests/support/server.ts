/**
 * Runs the built Tributary server (.output) for one test file: a private copy of the
 * seeded template database, a private capturing SMTP server, a free port.
 *
 *   const server = useServer()
 *   it('…', async () => { const admin = await server.signIn('admin@demo.tributary.test') })
 */
import { spawn, type ChildProcess } from 'node:child_process'
import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll } from 'vitest'
import pg from 'pg'
import { startMailCatcher } from '../../scripts/mail-catcher-lib'
import { startObjectStore, type ObjectStoreServer } from '../../scripts/object-store-lib'
import { ApiClient } from './client'
import { cloneTemplateDatabase, type TestDatabase } from './db'
import { sessionPassword } from './env'
import { freePort } from './ports'
import { createSeededDatabase, startPrivatePostgres, type PrivatePostgres } from './private-postgres'

const root = fileURLToPath(new URL('../..', import.meta.url))
export const demoPassword = 'tributary-demo'
export const demo = {
  admin: 'admin@demo.tributary.test',
  manager: 'manager@demo.tributary.test',
  biologist: 'biologist@demo.tributary.test',
  viewer: 'viewer@demo.tributary.test',
} as const

export interface CapturedMail {
  id: string
  to: string[] | string
  from: string
  subject: string
  text: string
  html?: string | null
  date: string
  attachments: { filename: string, contentType: string, size: number }[]
}

export interface TestServer {
  url: string
  databaseUrl: string
  /** A direct connection to this file's database (for arranging data and checking writes). */
  db: pg.Pool
  /** The mail catcher; stop() simulates an SMTP outage, start() brings it back on the same ports. */
  mail: { messages(): Promise<CapturedMail[]>, clear(): Promise<void>, stop(): Promise<void>, start(): Promise<void> }
  /** A client without a session. */
  anonymous(headers?: Record<string, string>): ApiClient
  /** A client signed in as `email` (demo password by default); throws when sign-in fails. */
  signIn(email: string, password?: string): Promise<ApiClient>
  /** Environment the server was started with (to restart it with the same settings). */
  env: Record<string, string>
  /** Stops and starts the app process again (same database and mail). */
  restart(extraEnv?: Record<string, string>): Promise<void>
  /** Process id of the app process now running (to show it was not restarted). */
  pid(): number | undefined
  /** With `useServer({ pg: 'private' })`: this file's own PostgreSQL cluster, free to stop and start. */
  postgres?: PrivatePostgres
  /** This file's private object store (s3rver on a free port, files in a temp dir); stop() simulates an outage, start() brings it back with the same files. */
  objectStore: { endpoint: string, bucket: string, directory: string, stop(): Promise<void>, start(): Promise<void> }
  /** The simulation worker started with `useServer({ worker: true })` (undefined otherwise). */
  worker?: TestWorker
  /** Starts another simulation worker on this file's database (stopped in afterAll unless stopped before). */
  startWorker(extraEnv?: Record<string, string>): Promise<TestWorker>
}

/** A simulation worker process (worker/index.ts) started by the harness. */
export interface TestWorker {
  child: ChildProcess
  /** Everything the worker printed so far. */
  output(): string
  /** SIGTERM (graceful: the run in progress goes back to the queue), SIGKILL after 10 s. */
  stop(): Promise<void>
  /** SIGKILL at once, as a crash would. */
  kill(): Promise<void>
}

/** Worker settings for tests: 2 threads, a 3-second lease and fast polling, so retries happen within seconds. */
export const testWorkerEnv: Record<string, string> = {
  TRIBUTARY_WORKER_THREADS: '2',
  TRIBUTARY_RUN_LEASE_SECONDS: '3',
  TRIBUTARY_WORKER_POLL_SECONDS: '0.5',
  TRIBUTARY_QUEUE_MAINTENANCE_SECONDS: '5',
}

/**
 * Starts `worker/index.ts` (through tsx) on `databaseUrl` and waits until it works the queue.
 *
 * @param databaseUrl - the test database
 * @param extraEnv - overrides of testWorkerEnv
 */
export async function startTestWorker(databaseUrl: string, extraEnv: Record<string, string> = {}): Promise<TestWorker> {
  let output = ''
  const child = spawn(process.execPath, ['--import', 'tsx', 'worker/index.ts'], {
    cwd: root, env: { ...process.env, NUXT_DATABASE_URL: databaseUrl, ...testWorkerEnv, ...extraEnv }, stdio: ['ignore', 'pipe', 'pipe'],
  })
  const collect = (d: Buffer) => {
    output += d.toString()
  }
  child.stdout?.on('data', collect)
  child.stderr?.on('data', collect)
  const exited = new Promise<void>(resolve => child.once('exit', () => resolve()))
  const ended = () => child.exitCode !== null || child.signalCode !== null
  const halt = async (signal: NodeJS.Signals) => {
    if (ended()) return
    child.kill(signal)
    const timer = setTimeout(() => child.kill('SIGKILL'), 10_000)
    await exited
    clearTimeout(timer)
  }
  const deadline = Date.now() + 60_000
  while (!output.includes('working queue')) {
    if (ended()) throw new Error(`The simulation worker exited early:\n${output}`)
    if (Date.now() > deadline) {
      await halt('SIGKILL')
      throw new Error(`The simulation worker did not start in time:\n${output}`)
    }
    await new Promise(resolve => setTimeout(resolve, 100))
  }
  return { child, output: () => output, stop: () => halt('SIGTERM'), kill: () => halt('SIGKILL') }
}

/** A running app process (the built server, .output/server/index.mjs). */
export interface AppProcess {
  child: ChildProcess
  /** Everything it printed so far. */
  output(): string
  /** SIGTERM, SIGKILL after 5 s. */
  stop(): Promise<void>
}

/**
 * Starts the built server with `env` (PORT, NUXT_DATABASE_URL, …) and waits until `url`/api/health
 * answers 200. useServer() runs its server this way; tests that need a second app (on a restored
 * database, say) call it directly and stop it themselves.
 */
export async function startAppProcess(url: string, env: Record<string, string>): Promise<AppProcess> {
  let log = ''
  const child = spawn(process.execPath, ['.output/server/index.mjs'], {
    cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'],
  })
  const collect = (d: Buffer) => {
    log += d.toString()
  }
  child.stdout?.on('data', collect)
  child.stderr?.on('data', collect)
  const stop = async () => {
    if (child.exitCode !== null || child.signalCode !== null) return
    const exited = new Promise(resolve => child.once('exit', resolve))
    child.kill('SIGTERM')
    const timer = setTimeout(() => child.kill('SIGKILL'), 5000)
    await exited
    clearTimeout(timer)
  }
  try {
    await waitForHealthy(url, child, () => log)
  } catch (error) {
    await stop()
    throw error
  }
  return { child, output: () => log, stop }
}

async function waitForHealthy(url: string, child: ChildProcess, output: () => string): Promise<void> {
  const deadline = Date.now() + 60_000
  let last = 'no answer yet'
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`The server exited early:\n${output()}`)
    try {
      const response = await fetch(new URL('/api/health', url), { signal: AbortSignal.timeout(10_000) })
      if (response.ok) return
      last = `${response.status} ${await response.text()}`
    } catch (error) {
      last = String(error) // not listening yet
    }
    await new Promise(resolve => setTimeout(resolve, 100))
  }
  throw new Error(`The server did not become healthy in time (last: ${last}):\n${output()}`)
}

/**
 * @param options.env - extra environment of the app process
 * @param options.worker - also start a simulation worker (worker/index.ts) on the same database
 * @param options.workerEnv - extra environment of that worker (see testWorkerEnv)
 * @param options.pg - 'shared' (default): a copy of the template on the shared PostgreSQL;
 *   'private': a cluster of this file's own (migrated and seeded; slower to prepare), as
 *   `server.postgres`, for tests that stop and start the database server
 */
export function useServer(options: { env?: Record<string, string>, worker?: boolean, workerEnv?: Record<string, string>, pg?: 'shared' | 'private' } = {}): TestServer {
  let database: TestDatabase | undefined
  let privatePostgres: PrivatePostgres | undefined
  let app: AppProcess | undefined
  let catcher: Awaited<ReturnType<typeof startMailCatcher>> | undefined
  let objectStore: ObjectStoreServer | undefined
  let objectStoreDir: string | undefined
  const workers: TestWorker[] = []

  const handle = {} as TestServer

  async function launch(env: Record<string, string>) {
    app = await startAppProcess(handle.url, env)
  }

  async function stop() {
    await app?.stop()
  }

  beforeAll(async () => {
    const [port, smtpPort, mailHttpPort] = [await freePort(), await freePort(), await freePort()]
    catcher = await startMailCatcher({ smtpPort, httpPort: mailHttpPort })
    const objectStorePort = await freePort()
    const storeDirectory = await mkdtemp(join(tmpdir(), 'tributary-object-store-'))
    objectStoreDir = storeDirectory
    objectStore = await startObjectStore({ port: objectStorePort, directory: storeDirectory })
    handle.objectStore = {
      endpoint: objectStore.endpoint, bucket: objectStore.bucket, directory: storeDirectory,
      stop: async () => { await objectStore?.close() },
      start: async () => { objectStore = await startObjectStore({ port: objectStorePort, directory: storeDirectory }) },
    }
    const objectStoreEnv = {
      NUXT_S3_ENDPOINT: objectStore.endpoint, NUXT_S3_BUCKET: objectStore.bucket, NUXT_S3_REGION: 'us-east-1',
      NUXT_S3_ACCESS_KEY_ID: 'S3RVER', NUXT_S3_SECRET_ACCESS_KEY: 'S3RVER', NUXT_S3_FORCE_PATH_STYLE: 'true',
    }
    if (options.pg === 'private') {
      privatePostgres = await startPrivatePostgres()
      handle.postgres = privatePostgres
      handle.databaseUrl = privatePostgres.url('tributary')
      await createSeededDatabase(handle.databaseUrl, objectStoreEnv)
    } else {
      database = await cloneTemplateDatabase()
      handle.databaseUrl = database.url
    }
    handle.url = `http://127.0.0.1:${port}`
    handle.db = new pg.Pool({ connectionString: handle.databaseUrl, max: 4 })
    // Dropping the database at the end terminates connections; an idle one must not crash the run.
    handle.db.on('error', () => {})
    handle.env = {
      PORT: String(port), HOST: '127.0.0.1', NODE_ENV: 'production',
      NUXT_DATABASE_URL: handle.databaseUrl, NUXT_SESSION_PASSWORD: sessionPassword,
      NUXT_APP_URL: handle.url, NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: String(smtpPort),
      TRIBUTARY_TEST: '1',
      ...objectStoreEnv,
      ...options.env,
    }
    handle.mail = {
      messages: async () => (await (await fetch(`http://127.0.0.1:${mailHttpPort}/messages`)).json()) as CapturedMail[],
      clear: async () => { await fetch(`http://127.0.0.1:${mailHttpPort}/messages`, { method: 'DELETE' }) },
      stop: async () => { await catcher?.close() },
      start: async () => { catcher = await startMailCatcher({ smtpPort, httpPort: mailHttpPort }) },
    }
    handle.pid = () => app?.child.pid
    handle.anonymous = (headers = {}) => new ApiClient(handle.url, headers)
    handle.signIn = async (email: string, password = demoPassword) => {
      const client = new ApiClient(handle.url)
      const response = await client.post('/api/auth/login', { email, password })
      if (response.status !== 200) throw new Error(`Sign-in as ${email} failed: ${response.status} ${JSON.stringify(response.body)}`)
      return client
    }
    handle.restart = async (extraEnv = {}) => {
      await stop()
      handle.env = { ...handle.env, ...extraEnv }
      await launch(handle.env)
    }
    await launch(handle.env)
    handle.startWorker = async (extraEnv = {}) => {
      const worker = await startTestWorker(handle.databaseUrl, { ...options.workerEnv, ...extraEnv })
      workers.push(worker)
      return worker
    }
    if (options.worker) handle.worker = await handle.startWorker()
  })

  afterAll(async () => {
    await Promise.all(workers.map(worker => worker.stop()))
    await stop()
    await handle.db?.end()
    await catcher?.close()
    await objectStore?.close()
    if (objectStoreDir) await rm(objectStoreDir, { recursive: true, force: true })
    await database?.drop()
    await privatePostgres?.destroy()
  })

  return handle
}

/** Polls `check` until it returns a value (bounded; no fixed sleeps in tests). */
export async function eventually<T>(check: () => Promise<T | undefined | null | false>, timeoutMs = 15_000): Promise<T> {
  const deadline = Date.now() + timeoutMs
  let last: unknown
  while (Date.now() < deadline) {
    try {
      const value = await check()
      if (value) return value
    } catch (error) { last = error }
    await new Promise(resolve => setTimeout(resolve, 100))
  }
  throw new Error(`Condition not met within ${timeoutMs} ms${last ? `: ${String(last)}` : ''}`)
}
