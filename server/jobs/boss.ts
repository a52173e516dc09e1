/**
 * pg-boss instances over connections we already have, for the app and the worker alike.
 *
 * pg-boss accepts any `{ executeSql(text, values) }` as its database; `sqlExecutor` wraps a pg
 * Pool (the worker's) or one client — in particular the client of an open Sequelize transaction
 * (`transactionExecutor`), so the app inserts a run row and its job in ONE transaction: either
 * both exist or neither does.
 */
import PgBoss from 'pg-boss'
import type pg from 'pg'
import type { Transaction } from 'sequelize'

/** Something with pg's `query(text, values)`. */
export interface Queryable { query: (text: string, values?: unknown[]) => Promise<{ rows: unknown[] }> }

/**
 * pg-boss's database interface over a pg Pool or client.
 *
 * @param target - a pg Pool or a connected client
 */
export function sqlExecutor(target: Queryable): PgBoss.Db {
  return {
    executeSql: async (text: string, values?: unknown[]) => {
      const result = await target.query(text, values)
      return { rows: result.rows as unknown[] as never[] }
    },
  }
}

/**
 * pg-boss's database interface inside an open Sequelize transaction: statements run on the
 * transaction's own connection, so they commit or roll back with it.
 *
 * @param transaction - an open (not yet committed) Sequelize transaction on PostgreSQL
 * @throws Error when the transaction has no connection (already finished)
 */
export function transactionExecutor(transaction: Transaction): PgBoss.Db {
  // Sequelize keeps the pg client of a transaction on `connection` (not in its typings).
  const client = (transaction as unknown as { connection?: pg.ClientBase }).connection
  if (!client) throw new Error('transactionExecutor: the transaction has no open connection')
  return sqlExecutor(client as unknown as Queryable)
}

/** How a pg-boss instance behaves. */
export interface BossOptions {
  /** Run pg-boss maintenance (expiry backstop, archiving) in this process; the worker does, the app does not. */
  supervise: boolean
  /** Seconds between maintenance runs (default pg-boss's 120). */
  maintenanceIntervalSeconds?: number
}

/**
 * A pg-boss instance on `pool`, not started. Creates or migrates pg-boss's schema on `start()`
 * (safe when several processes start at once). Cron scheduling is off: nothing here is
 * scheduled.
 *
 * @param pool - the pg Pool (or client) pg-boss uses for every statement
 * @param options - see BossOptions
 * @returns the instance; call `start()`, and `stop()` when done
 */
export function createBoss(pool: Queryable, options: BossOptions): PgBoss {
  return new PgBoss({
    db: sqlExecutor(pool),
    schedule: false,
    migrate: true,
    supervise: options.supervise,
    ...(options.maintenanceIntervalSeconds ? { maintenanceIntervalSeconds: options.maintenanceIntervalSeconds } : {}),
  })
}
