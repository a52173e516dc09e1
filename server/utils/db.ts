/**
 * The server's database handle: `const { sequelize, models } = await useDb()` in any route or
 * util (auto-imported). The connection is made once per process, on first use, from
 * `runtimeConfig.databaseUrl` (env NUXT_DATABASE_URL); the schema comes from
 * `npm run db:migrate`, never from the server.
 *
 * When the database cannot be reached, `useDb()` throws a 503 with DB_UNAVAILABLE_MESSAGE and
 * forgets the failed attempt, so the next request tries again. Errors thrown later by queries
 * (the server went away mid-flight) can be recognised with `isDbUnavailable(error)`; the error
 * handler answers them with the same 503.
 */
import { createDb, DB_UNAVAILABLE_MESSAGE, describeDatabaseUrl, isDbUnavailable, type Db } from '../db/connection'

export { DB_UNAVAILABLE_MESSAGE, isDbUnavailable }
export type { Db }

let pending: Promise<Db> | undefined

/** An H3 error for "the database is not reachable", status 503. */
export function dbUnavailableError(cause?: unknown) {
  return createError({ status: 503, statusText: 'Service Unavailable', message: DB_UNAVAILABLE_MESSAGE, cause })
}

async function connect(): Promise<Db> {
  const url = useRuntimeConfig().databaseUrl as string
  const db = createDb(url)
  try {
    await db.sequelize.authenticate()
  } catch (error) {
    await db.sequelize.close().catch(() => {})
    console.error(`[db] cannot reach ${describeDatabaseUrl(url)}:`, error instanceof Error ? error.message : error)
    throw isDbUnavailable(error) ? dbUnavailableError(error) : error
  }
  return db
}

/**
 * The process-wide connection and models (memoised promise).
 *
 * @returns `{ sequelize, models }`
 * @throws H3Error 503 when the database is not reachable
 */
export function useDb(): Promise<Db> {
  if (!pending) {
    pending = connect().catch((error: unknown) => {
      pending = undefined
      throw error
    })
  }
  return pending
}

/** Closes the pool (for a Nitro `close` hook); the next `useDb()` connects again. */
export async function closeDb(): Promise<void> {
  const current = pending
  pending = undefined
  const db = await current?.catch(() => undefined)
  await db?.sequelize.close()
}
