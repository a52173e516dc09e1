/**
 * The records' versions (migration 0009-data-version), on which the server's remembered answers
 * rest (server/utils/read-cache.ts): every table is either counted or left out on purpose; a
 * committed change moves its table's counter once per transaction, at commit and not before;
 * nothing moves for a rolled-back transaction or for reads; TRUNCATE counts; and a second
 * connection never sees the counter move without also seeing the change.
 */
import { QueryTypes, Sequelize, type Transaction } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { runMigrations } from '../../server/db/migrate'
import { VERSIONED_TABLES } from '../../server/db/versioned-tables'
import { createTestDatabase } from '../support/db'
import { createMigratedDatabase, type MigratedDatabase } from './helpers'

/** Tables deliberately not counted (high churn, read by no remembered answer, or bookkeeping). */
const UNCOUNTED = ['audit_events', 'data_version', 'outbox_messages', 'sign_in_attempts', 'simulation_runs', 'tributary_migrations', 'user_tokens']

let db: MigratedDatabase
let agencyId: number

async function versions(transaction?: Transaction): Promise<Record<string, number>> {
  const [row] = await db.sequelize.query<{ versions: Record<string, number | string> }>('SELECT versions FROM data_version WHERE id = 1', { type: QueryTypes.SELECT, transaction })
  return Object.fromEntries(Object.entries(row?.versions ?? {}).map(([table, value]) => [table, Number(value)]))
}

/** Counters that moved between two readings, with how far. */
function moved(before: Record<string, number>, after: Record<string, number>): Record<string, number> {
  return Object.fromEntries(Object.keys(after).filter(table => after[table] !== before[table]).map(table => [table, (after[table] ?? 0) - (before[table] ?? 0)]))
}

beforeAll(async () => {
  db = await createMigratedDatabase()
  const agency = await db.models.Agency.create({ name: 'Version Test Agency', shortName: 'VTA', logoStorageKey: null, signingCertificateStorageKey: null })
  agencyId = agency.id
})

afterAll(async () => {
  await db?.dispose()
})

describe('data_version', () => {
  it('counts every table of the schema except the ones left out on purpose', async () => {
    const tables = await db.sequelize.query<{ name: string }>(
      `SELECT table_name AS name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY 1`,
      { type: QueryTypes.SELECT },
    )
    const counted = tables.map(row => row.name).filter(name => !UNCOUNTED.includes(name))
    expect(counted).toEqual([...VERSIONED_TABLES].sort())
    expect(Object.keys(await versions()).sort()).toEqual([...VERSIONED_TABLES].sort())
    const triggers = await db.sequelize.query<{ table: string, name: string }>(
      `SELECT c.relname AS table, t.tgname AS name FROM pg_trigger t JOIN pg_class c ON c.oid = t.tgrelid
        WHERE NOT t.tgisinternal AND t.tgname LIKE '%data_version%' ORDER BY 1, 2`,
      { type: QueryTypes.SELECT },
    )
    expect(triggers.map(row => `${row.table}:${row.name}`)).toEqual(
      [...VERSIONED_TABLES].sort().flatMap(table => [`${table}:${table}_data_version`, `${table}:${table}_data_version_truncate`]),
    )
  })

  it('starts every counter at the same random number, different in another database', async () => {
    // Only `agencies` has been written (beforeAll); every other counter still has its first value.
    const { agencies: _written, ...untouched } = await versions()
    const start = Object.values(untouched)
    expect(new Set(start).size).toBe(1)
    // A plain connection (createDb would bind the models to it).
    const other = await createTestDatabase()
    const sequelize = new Sequelize(other.url, { logging: false })
    try {
      await runMigrations(sequelize)
      const [row] = await sequelize.query<{ versions: Record<string, number> }>('SELECT versions FROM data_version', { type: QueryTypes.SELECT })
      expect(Object.values(row?.versions ?? {})[0]).not.toBe(start[0])
    } finally {
      await sequelize.close()
      await other.drop()
    }
  })

  it('moves the counter of each changed table once per transaction, at commit', async () => {
    const before = await versions()
    await db.sequelize.transaction(async (t) => {
      const species = await db.models.Species.create({ agencyId, commonName: 'Version vole', scientificName: 'Microtus versionis', notes: '', invented: true }, { transaction: t })
      await species.update({ notes: 'changed twice in one transaction' }, { transaction: t })
      await db.sequelize.query(`UPDATE agencies SET name = name || '.' WHERE id = :agencyId`, { replacements: { agencyId }, transaction: t })
      // Not yet: the counters move at commit.
      expect(moved(before, await versions(t))).toEqual({})
    })
    expect(moved(before, await versions())).toEqual({ species: 1, agencies: 1 })
  })

  it('moves nothing for a transaction that rolls back, or for reads', async () => {
    const before = await versions()
    await expect(db.sequelize.transaction(async (t) => {
      await db.models.Species.create({ agencyId, commonName: 'Rolled-back vole', scientificName: 'Microtus nullus', notes: '', invented: true }, { transaction: t })
      throw new Error('roll back')
    })).rejects.toThrow('roll back')
    await db.models.Species.findAll()
    expect(moved(before, await versions())).toEqual({})
  })

  it('counts a statement outside a transaction, a DELETE, and a TRUNCATE', async () => {
    const before = await versions()
    await db.sequelize.query(`INSERT INTO species (agency_id, common_name, scientific_name, notes, invented) VALUES (:agencyId, 'Plain vole', 'Microtus planus', '', true)`, { replacements: { agencyId } })
    await db.sequelize.query(`DELETE FROM species WHERE common_name = 'Plain vole'`)
    expect(moved(before, await versions())).toEqual({ species: 2 })
    await db.sequelize.query('TRUNCATE monitoring_observations CASCADE')
    expect(moved(before, await versions())).toEqual({ species: 2, monitoring_observations: 1 })
  })

  it('never shows another connection a moved counter without the change', async () => {
    // Reader: read the counter, then the rows, as requireUser and a remembered read do.
    const before = await versions()
    const commit = db.sequelize.transaction(async (t) => {
      await db.models.Species.create({ agencyId, commonName: 'Late vole', scientificName: 'Microtus tardus', notes: '', invented: true }, { transaction: t })
      await db.sequelize.query('SELECT pg_sleep(0.2)', { transaction: t })
    })
    const seen: { counter: number, rows: number }[] = []
    while (seen.length === 0 || seen[seen.length - 1]!.counter === before.species) {
      const counter = (await versions()).species!
      const [row] = await db.sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM species WHERE common_name = 'Late vole'`, { type: QueryTypes.SELECT })
      seen.push({ counter, rows: Number(row?.n) })
    }
    await commit
    for (const reading of seen) {
      if (reading.counter !== before.species) expect(reading.rows, 'a moved counter comes with the change').toBe(1)
    }
  })
})
