/**
 * Throw-away PostgreSQL databases on the local server for tests.
 * `createTestDatabase()` gives an empty database; `cloneTemplateDatabase()` a copy of the
 * migrated, seeded template built once per run by global-services.ts.
 */
import { randomBytes } from 'node:crypto'
import pg from 'pg'
import { inject } from 'vitest'
import { databaseUrl } from './env'

async function withAdmin<T>(fn: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: databaseUrl('postgres') })
  await client.connect()
  try {
    return await fn(client)
  } finally {
    await client.end()
  }
}

export interface TestDatabase { name: string, url: string, drop(): Promise<void> }

async function create(template?: string): Promise<TestDatabase> {
  const name = `tributary_test_${randomBytes(5).toString('hex')}`
  await withAdmin(c => c.query(`CREATE DATABASE "${name}"${template ? ` TEMPLATE "${template}"` : ''}`))
  return {
    name,
    url: databaseUrl(name),
    drop: () => dropDatabase(name),
  }
}

/** Drops a database, ending any connections still open to it. */
export async function dropDatabase(name: string): Promise<void> {
  await withAdmin(c => c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`))
}

/** An empty database (no tables): for migration tests. */
export function createTestDatabase(): Promise<TestDatabase> {
  return create()
}

/** A copy of the migrated and seeded template database. */
export function cloneTemplateDatabase(): Promise<TestDatabase> {
  return create(inject('templateDatabase'))
}
