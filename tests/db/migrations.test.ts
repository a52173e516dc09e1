/**
 * Migration runner: up from an empty database, down to zero, up again; status; advisory lock
 * against concurrent runners; a failing step leaves nothing behind.
 */
import { QueryTypes, type Sequelize } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createDb } from '../../server/db/connection'
import { migrationStatus, MIGRATIONS_TABLE, rollbackMigrations, runMigrations } from '../../server/db/migrate'
import { migrations } from '../../server/db/migrations'
import { upSteps } from '../../server/db/runner'
import { createTestDatabase, type TestDatabase } from '../support/db'

const APP_TABLES = [
  'agencies', 'agency_logos', 'agency_signing_certificates', 'attachments', 'audit_events', 'census_counts', 'comments', 'data_version',
  'decisions', 'effective_size_estimates', 'genetic_datasets', 'issued_briefs', 'monitoring_observations',
  'outbox_messages', 'proposal_versions', 'proposals', 'scenarios', 'sign_in_attempts', 'simulation_runs', 'species',
  'subpopulations', 'translocations', 'user_tokens', 'users',
]

async function tables(sequelize: Sequelize): Promise<string[]> {
  const rows = await sequelize.query<{ name: string }>(
    `SELECT table_name AS name FROM information_schema.tables WHERE table_schema = 'public' ORDER BY table_name`,
    { type: QueryTypes.SELECT },
  )
  return rows.map(row => row.name)
}

async function functions(sequelize: Sequelize): Promise<string[]> {
  const rows = await sequelize.query<{ name: string }>(
    `SELECT p.proname AS name FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace WHERE n.nspname = 'public'`,
    { type: QueryTypes.SELECT },
  )
  return rows.map(row => row.name)
}

describe('migrations', () => {
  let database: TestDatabase
  let sequelize: Sequelize

  beforeAll(async () => {
    database = await createTestDatabase()
    sequelize = createDb(database.url).sequelize
  })

  afterAll(async () => {
    await sequelize.close()
    await database.drop()
  })

  it('reports every migration pending on an empty database, without creating anything', async () => {
    expect(await migrationStatus(sequelize)).toEqual({ executed: [], pending: migrations.map(m => m.name) })
    expect(await tables(sequelize)).toEqual([])
  })

  it('migrates up from empty, creating every table and recording the migration', async () => {
    const { applied } = await runMigrations(sequelize)
    expect(applied).toEqual(migrations.map(m => m.name))
    expect(await tables(sequelize)).toEqual([...APP_TABLES, MIGRATIONS_TABLE].sort())
    expect(await migrationStatus(sequelize)).toEqual({ executed: applied, pending: [] })
  })

  it('applies nothing the second time', async () => {
    expect(await runMigrations(sequelize)).toEqual({ applied: [] })
  })

  it('migrates down to zero, leaving only the (empty) record table', async () => {
    const { reverted } = await rollbackMigrations(sequelize, 0)
    expect(reverted).toEqual(migrations.map(m => m.name).reverse())
    expect(await tables(sequelize)).toEqual([MIGRATIONS_TABLE])
    expect(await functions(sequelize)).toEqual([])
    expect((await migrationStatus(sequelize)).executed).toEqual([])
  })

  it('migrates up again after going down', async () => {
    const { applied } = await runMigrations(sequelize)
    expect(applied).toEqual(migrations.map(m => m.name))
    expect(await tables(sequelize)).toEqual([...APP_TABLES, MIGRATIONS_TABLE].sort())
  })

  it('rolls back every step of a run when one step fails, including its record', async () => {
    const steps = [
      {
        name: 'test-1-create',
        up: async ({ context }: { context: { sequelize: Sequelize, transaction: unknown } }) => {
          await context.sequelize.query('CREATE TABLE probe_created (id int)', { transaction: context.transaction as never })
        },
        down: async () => {},
      },
      {
        name: 'test-2-fail',
        up: async ({ context }: { context: { sequelize: Sequelize, transaction: unknown } }) => {
          await context.sequelize.query('SELECT * FROM no_such_table', { transaction: context.transaction as never })
        },
        down: async () => {},
      },
    ]
    await expect(upSteps(sequelize, steps, 'probe_steps')).rejects.toThrow(/test-2-fail/)
    const names = await tables(sequelize)
    expect(names).not.toContain('probe_created')
    expect(names).not.toContain('probe_steps')
  })
})

describe('concurrent runners', () => {
  it('two runners started together on one pool apply each migration once', async () => {
    const database = await createTestDatabase()
    const { sequelize } = createDb(database.url)
    try {
      const results = await Promise.all([runMigrations(sequelize), runMigrations(sequelize)])
      const applied = results.flatMap(result => result.applied)
      expect(applied.sort()).toEqual(migrations.map(m => m.name).sort())
      expect((await migrationStatus(sequelize)).pending).toEqual([])
    } finally {
      await sequelize.close()
      await database.drop()
    }
  })

  it('three separate connections (like three processes) started together do not race', async () => {
    const database = await createTestDatabase()
    const instances = [createDb(database.url), createDb(database.url), createDb(database.url)]
    try {
      const results = await Promise.all(instances.map(({ sequelize }) => runMigrations(sequelize)))
      const counts = results.map(result => result.applied.length).sort()
      expect(counts).toEqual([0, 0, migrations.length])
      const [first] = instances
      const recorded = await first!.sequelize.query<{ name: string }>(`SELECT name FROM ${MIGRATIONS_TABLE}`, { type: QueryTypes.SELECT })
      expect(recorded.map(row => row.name)).toEqual(migrations.map(m => m.name))
    } finally {
      for (const { sequelize } of instances) await sequelize.close()
      await database.drop()
    }
  })
})
