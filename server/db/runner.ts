/**
 * Runs a list of steps (migrations or seeds) with umzug, all in one transaction that first
 * takes a PostgreSQL advisory lock: two processes starting together queue on the lock, and
 * the second one finds the work done. PostgreSQL DDL is transactional, so a failing step
 * rolls back every step of that run and its record in the storage table.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import { Umzug } from 'umzug'
import type { MigrationContext, MigrationStep } from './migrations/context'
import { TransactionalStorage } from './storage'

/**
 * Advisory lock key (two int4 halves) shared by migrations and seeds, so they never
 * interleave. 0x54524942 is 'TRIB' in ASCII.
 */
export const SCHEMA_LOCK_KEY: readonly [number, number] = [0x54524942, 1]

/** Runs `work` in a transaction that holds the schema advisory lock until it commits. */
export async function withSchemaLock<T>(sequelize: Sequelize, work: (transaction: Transaction) => Promise<T>): Promise<T> {
  return sequelize.transaction(async (transaction) => {
    await sequelize.query('SELECT pg_advisory_xact_lock(:classId, :objectId)', {
      replacements: { classId: SCHEMA_LOCK_KEY[0], objectId: SCHEMA_LOCK_KEY[1] },
      transaction,
    })
    return work(transaction)
  })
}

function createUmzug(sequelize: Sequelize, steps: readonly MigrationStep[], table: string, transaction: Transaction): Umzug<MigrationContext> {
  const context: MigrationContext = { sequelize, queryInterface: sequelize.getQueryInterface(), transaction }
  return new Umzug<MigrationContext>({
    migrations: steps.map(step => ({ name: step.name, up: step.up, down: step.down })),
    context,
    storage: new TransactionalStorage(sequelize, table, transaction),
    logger: undefined,
  })
}

/** Applies every pending step; returns the names applied, in order. */
export async function upSteps(sequelize: Sequelize, steps: readonly MigrationStep[], table: string): Promise<string[]> {
  return withSchemaLock(sequelize, async (transaction) => {
    const applied = await createUmzug(sequelize, steps, table, transaction).up()
    return applied.map(step => step.name)
  })
}

/**
 * Reverts executed steps, newest first, down to (and including) `to`, or all of them when `to`
 * is 0. Returns the names reverted, in the order they were reverted.
 */
export async function downSteps(sequelize: Sequelize, steps: readonly MigrationStep[], table: string, to: string | 0): Promise<string[]> {
  return withSchemaLock(sequelize, async (transaction) => {
    const reverted = await createUmzug(sequelize, steps, table, transaction).down({ to })
    return reverted.map(step => step.name)
  })
}

/** Names of executed and pending steps; reads without taking the lock or creating tables. */
export async function stepStatus(sequelize: Sequelize, steps: readonly MigrationStep[], table: string): Promise<{ executed: string[], pending: string[] }> {
  const found = await sequelize.query<{ present: boolean }>(
    'SELECT to_regclass(:table) IS NOT NULL AS present',
    { replacements: { table }, type: QueryTypes.SELECT, plain: true },
  )
  let executed: string[] = []
  if (found?.present) {
    // The table name is one of our own constants, never user input.
    const rows = await sequelize.query<{ name: string }>(`SELECT name FROM "${table}" ORDER BY name`, { type: QueryTypes.SELECT })
    executed = rows.map(row => row.name)
  }
  const done = new Set(executed)
  return { executed, pending: steps.map(step => step.name).filter(name => !done.has(name)) }
}
