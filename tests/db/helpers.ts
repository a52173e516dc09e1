/**
 * Small helpers for the db tests: a migrated throw-away database per test file, and an
 * assertion that the database (not the model layer) refused a statement for a named reason.
 */
import { expect } from 'vitest'
import { createDb, type Db } from '../../server/db/connection'
import { runMigrations } from '../../server/db/migrate'
import { createTestDatabase, type TestDatabase } from '../support/db'

export interface MigratedDatabase extends Db {
  database: TestDatabase
  /** Closes the pool and drops the database. */
  dispose(): Promise<void>
}

/** A fresh database with the schema migrated, and a connection with the models bound to it. */
export async function createMigratedDatabase(): Promise<MigratedDatabase> {
  const database = await createTestDatabase()
  const db = createDb(database.url)
  await runMigrations(db.sequelize)
  return {
    ...db,
    database,
    async dispose() {
      await db.sequelize.close()
      await database.drop()
    },
  }
}

interface PgErrorShape { code?: string, constraint?: string, message?: string }

/**
 * Expects `statement` to be refused by PostgreSQL with SQLSTATE `code` and, when given, the
 * named constraint (or, for trigger errors, a message matching `constraint`).
 */
export async function expectRefused(statement: Promise<unknown>, code: string, constraint?: string | RegExp): Promise<void> {
  let caught: unknown
  try {
    await statement
  } catch (error) {
    caught = error
  }
  expect(caught, 'the statement should have been refused').toBeDefined()
  const pgError = ((caught as { original?: PgErrorShape }).original ?? caught) as PgErrorShape
  expect(pgError.code, `SQLSTATE of: ${pgError.message}`).toBe(code)
  if (typeof constraint === 'string') expect(pgError.constraint).toBe(constraint)
  if (constraint instanceof RegExp) expect(pgError.message).toMatch(constraint)
}

/** SQLSTATE codes used in the assertions. */
export const SQLSTATE = {
  checkViolation: '23514',
  foreignKeyViolation: '23503',
  uniqueViolation: '23505',
  notNullViolation: '23502',
  insufficientPrivilege: '42501',
} as const
