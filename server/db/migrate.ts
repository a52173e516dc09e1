/**
 * Schema migrations: `runMigrations` applies pending ones (scripts/db-migrate.ts, test set-up),
 * `rollbackMigrations` reverts them, `migrationStatus` reports without changing anything.
 * Executed migrations are recorded in the table `tributary_migrations`. All work runs in one
 * transaction under a PostgreSQL advisory lock (./runner.ts), so concurrent starts don't race.
 */
import type { Sequelize } from 'sequelize'
import { migrations } from './migrations'
import { downSteps, stepStatus, upSteps } from './runner'

export const MIGRATIONS_TABLE = 'tributary_migrations'

/**
 * Applies every pending migration.
 *
 * @param sequelize - connection to the target database
 * @returns names of the migrations applied now (empty when the schema was up to date)
 * @example await runMigrations(sequelize) // ['0001-foundation'] on an empty database, then []
 */
export async function runMigrations(sequelize: Sequelize): Promise<{ applied: string[] }> {
  return { applied: await upSteps(sequelize, migrations, MIGRATIONS_TABLE) }
}

/**
 * Reverts migrations, newest first, down to and including `to` (default 0: all of them).
 * Reverting the foundation drops every table and its data: for development and tests only.
 *
 * @param sequelize - connection to the target database
 * @param to - name of the oldest migration to revert, or 0 for all
 * @returns names reverted, newest first
 */
export async function rollbackMigrations(sequelize: Sequelize, to: string | 0 = 0): Promise<{ reverted: string[] }> {
  return { reverted: await downSteps(sequelize, migrations, MIGRATIONS_TABLE, to) }
}

/** Names of executed and pending migrations (for health checks: pending ones mean "run db:migrate"). */
export async function migrationStatus(sequelize: Sequelize): Promise<{ executed: string[], pending: string[] }> {
  return stepStatus(sequelize, migrations, MIGRATIONS_TABLE)
}
