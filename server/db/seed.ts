/**
 * Seeds: invented demo data (seeds/), applied by a second umzug runner recorded in the table
 * `tributary_seeds`, under the same advisory lock as migrations. Each seed runs once per
 * database; running again applies nothing.
 */
import type { Sequelize } from 'sequelize'
import { seeds } from '../../seeds'
import { migrationStatus } from './migrate'
import { downSteps, stepStatus, upSteps } from './runner'

export const SEEDS_TABLE = 'tributary_seeds'

/**
 * Applies every seed not applied yet. The schema must be migrated first.
 *
 * @param sequelize - connection to the target database
 * @returns names of the seeds applied now (empty when all had run before)
 * @throws Error naming the pending migrations when the schema is not up to date
 */
export async function runSeeds(sequelize: Sequelize): Promise<{ applied: string[] }> {
  const { pending } = await migrationStatus(sequelize)
  if (pending.length > 0) {
    throw new Error(`Cannot seed: the database has pending migrations (${pending.join(', ')}). Run "npm run db:migrate" first.`)
  }
  return { applied: await upSteps(sequelize, seeds, SEEDS_TABLE) }
}

/** Reverts seeds, newest first, down to and including `to` (default 0: all). */
export async function revertSeeds(sequelize: Sequelize, to: string | 0 = 0): Promise<{ reverted: string[] }> {
  return { reverted: await downSteps(sequelize, seeds, SEEDS_TABLE, to) }
}

/** Names of applied and pending seeds. */
export async function seedStatus(sequelize: Sequelize): Promise<{ executed: string[], pending: string[] }> {
  return stepStatus(sequelize, seeds, SEEDS_TABLE)
}
