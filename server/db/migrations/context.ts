/**
 * What every migration and seed receives: the connection and the transaction the runner opened
 * (all pending steps run in that one transaction, under an advisory lock; see ../migrate.ts).
 * Pass `{ transaction }` to every query.
 */
import type { QueryInterface, Sequelize, Transaction } from 'sequelize'

export interface MigrationContext {
  sequelize: Sequelize
  queryInterface: QueryInterface
  transaction: Transaction
}

/** One step: a name recorded in the storage table, and how to apply and revert it. */
export interface MigrationStep {
  name: string
  up: (params: { context: MigrationContext }) => Promise<void>
  down: (params: { context: MigrationContext }) => Promise<void>
}
