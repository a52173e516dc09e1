/**
 * Demo seed: refuses an unmigrated database, is idempotent (twice, concurrently, and even with
 * its record removed), holds believable invented data, and its passwords verify with the very
 * code nuxt-auth-utils uses at sign-in.
 */
import { readFile } from 'node:fs/promises'
import { fileURLToPath } from 'node:url'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { booleanPointInPolygon, booleanValid, kinks, point } from '@turf/turf'
import { QueryTypes, type Sequelize } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createDb, type Db } from '../../server/db/connection'
import { runMigrations } from '../../server/db/migrate'
import { verifyPasswordScrypt } from '../../server/db/password'
import { revertSeeds, runSeeds, seedStatus, SEEDS_TABLE } from '../../server/db/seed'
import { loadDemoData } from '../../seeds/demo/data'
import { seeds } from '../../seeds/index'
import { createTestDatabase, type TestDatabase } from '../support/db'

interface AuthUtilsPassword {
  hashPassword: (plain: string) => Promise<string>
  verifyPassword: (hash: string, plain: string) => Promise<boolean>
}

/**
 * Loads nuxt-auth-utils' own server password helpers (hashPassword / verifyPassword) outside
 * Nitro. The file imports `useRuntimeConfig` from Nitro's virtual '#imports', which plain Node
 * cannot resolve, so its three imports are checked to be exactly the expected ones and then
 * supplied by hand: @adonisjs/hash's Hash and Scrypt, and the runtime config the module sets
 * by default ({ hash: { scrypt: {} } }). If an upgrade changes that file, this fails loudly.
 */
async function loadAuthUtilsPassword(): Promise<AuthUtilsPassword> {
  const file = fileURLToPath(new URL('../../node_modules/nuxt-auth-utils/dist/runtime/server/utils/password.js', import.meta.url))
  const source = await readFile(file, 'utf8')
  expect(source.match(/^import .*$/gm)).toEqual([
    'import { Hash } from "@adonisjs/hash";',
    'import { Scrypt } from "@adonisjs/hash/drivers/scrypt";',
    'import { useRuntimeConfig } from "#imports";',
  ])
  const body = source.replace(/^import .*$/gm, '').replace(/^export /gm, '')
  const factory = new Function('Hash', 'Scrypt', 'useRuntimeConfig', `${body}\nreturn { hashPassword, verifyPassword };`)
  return factory(Hash, Scrypt, () => ({ hash: { scrypt: {} } })) as AuthUtilsPassword
}

/** The data file rounds figures to 0.1, so a recomputed figure may differ by up to 0.05. */
function expectWithinRounding(actual: number | null, expected: number, label: string): void {
  expect(actual, label).not.toBeNull()
  expect(Math.abs((actual ?? Number.NaN) - expected), label).toBeLessThanOrEqual(0.05 + 1e-9)
}

const TABLES = ['agencies', 'users', 'species', 'subpopulations', 'census_counts', 'effective_size_estimates'] as const

async function counts(sequelize: Sequelize): Promise<Record<string, number>> {
  const result: Record<string, number> = {}
  for (const table of TABLES) {
    const [found] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, { type: QueryTypes.SELECT })
    result[table] = Number(found?.n)
  }
  return result
}

let database: TestDatabase
let db: Db

beforeAll(async () => {
  database = await createTestDatabase()
  db = createDb(database.url)
})

afterAll(async () => {
  await db?.sequelize.close()
  await database?.drop()
})

describe('running the seeds', () => {
  it('refuses to seed before the schema is migrated, naming the fix', async () => {
    await expect(runSeeds(db.sequelize)).rejects.toThrow(/pending migrations \(0001-foundation[,)].*db:migrate/)
  })

  it('applies the demo seed once, even when two runs start together', async () => {
    await runMigrations(db.sequelize)
    const results = await Promise.all([runSeeds(db.sequelize), runSeeds(db.sequelize)])
    expect(results.flatMap(result => result.applied)).toEqual(seeds.map(seed => seed.name))
    expect(await seedStatus(db.sequelize)).toEqual({ executed: seeds.map(seed => seed.name), pending: [] })
  })

  it('creates the expected number of rows', async () => {
    const data = loadDemoData()
    expect(await counts(db.sequelize)).toEqual({
      agencies: 1,
      users: 4,
      species: 1,
      subpopulations: 10,
      census_counts: data.subpopulations.reduce((sum, record) => sum + record.census.length, 0),
      effective_size_estimates: data.subpopulations.reduce((sum, record) => sum + record.estimates.length, 0),
    })
  })

  it('changes nothing when run again', async () => {
    const before = await counts(db.sequelize)
    expect(await runSeeds(db.sequelize)).toEqual({ applied: [] })
    expect(await counts(db.sequelize)).toEqual(before)
  })

  it('changes nothing when run again after its record was lost', async () => {
    const before = await counts(db.sequelize)
    await db.sequelize.query(`DELETE FROM ${SEEDS_TABLE}`)
    expect(await runSeeds(db.sequelize)).toEqual({ applied: seeds.map(seed => seed.name) })
    expect(await counts(db.sequelize)).toEqual(before)
  })
})

describe('the demo data', () => {
  it('is one invented agency with one user per role at demo.tributary.test', async () => {
    const { Agency, User } = db.models
    const agencies = await Agency.findAll()
    expect(agencies.map(agency => agency.name)).toEqual(['Eastern Uplands Wildlife Service'])
    const users = await User.findAll({ order: [['id', 'ASC']] })
    expect(users.map(user => [user.email, user.role, user.active, user.agencyId])).toEqual([
      ['admin@demo.tributary.test', 'administrator', true, agencies[0]?.id],
      ['manager@demo.tributary.test', 'manager', true, agencies[0]?.id],
      ['biologist@demo.tributary.test', 'biologist', true, agencies[0]?.id],
      ['viewer@demo.tributary.test', 'viewer', true, agencies[0]?.id],
    ])
  })

  it('marks the species as invented', async () => {
    const species = await db.models.Species.findAll()
    expect(species).toHaveLength(1)
    expect(species[0]?.invented).toBe(true)
    expect(species[0]?.notes).toMatch(/^Invented demo data/)
  })

  it('has ten valid, non-self-intersecting boundaries of 2–400 km² in the southern Appalachian highlands', async () => {
    const subpopulations = await db.models.Subpopulation.findAll()
    expect(subpopulations).toHaveLength(10)
    for (const subpopulation of subpopulations) {
      const geometry = subpopulation.geometry
      expect(geometry?.type, subpopulation.name).toBe('Polygon')
      if (geometry?.type !== 'Polygon') continue
      expect(booleanValid(geometry), subpopulation.name).toBe(true)
      expect(kinks(geometry).features, subpopulation.name).toHaveLength(0)
      expect(subpopulation.areaKm2).toBeGreaterThanOrEqual(2)
      expect(subpopulation.areaKm2).toBeLessThanOrEqual(400)
      const centroid = [subpopulation.centroidLon ?? Number.NaN, subpopulation.centroidLat ?? Number.NaN]
      expect(centroid[0]).toBeGreaterThanOrEqual(-84.5)
      expect(centroid[0]).toBeLessThanOrEqual(-81)
      expect(centroid[1]).toBeGreaterThanOrEqual(34.8)
      expect(centroid[1]).toBeLessThanOrEqual(37)
      // The outlines are convex enough that their centre of mass lies inside.
      expect(booleanPointInPolygon(point(centroid), geometry), subpopulation.name).toBe(true)
      for (const [lon, lat] of geometry.coordinates.flat()) {
        expect(lon).toBeGreaterThanOrEqual(-84.5)
        expect(lon).toBeLessThanOrEqual(-81)
        expect(lat).toBeGreaterThanOrEqual(34.8)
        expect(lat).toBeLessThanOrEqual(37)
      }
    }
    const areas = subpopulations.map(subpopulation => subpopulation.areaKm2 ?? 0)
    expect(areas.filter(area => area < 5).length, 'a couple of small patches').toBeGreaterThanOrEqual(2)
  })

  it('spans very different sizes, isolation times and environments', async () => {
    const subpopulations = await db.models.Subpopulation.findAll({ include: ['censusCounts'] })
    const latest = subpopulations.map((subpopulation) => {
      const rows = [...(subpopulation.censusCounts ?? [])].sort((a, b) => a.year - b.year)
      return rows.at(-1)?.adults ?? 0
    })
    expect(Math.min(...latest)).toBeLessThan(50)
    expect(Math.max(...latest)).toBeGreaterThan(1000)
    const isolation = subpopulations.map(subpopulation => subpopulation.yearsIsolated ?? -1)
    expect(Math.min(...isolation)).toBeGreaterThanOrEqual(5)
    expect(Math.max(...isolation)).toBeLessThanOrEqual(150)
    expect(Math.max(...isolation) - Math.min(...isolation)).toBeGreaterThan(100)
    expect(new Set(subpopulations.map(subpopulation => subpopulation.environmentClass)).size).toBeGreaterThanOrEqual(6)
    for (const subpopulation of subpopulations) {
      expect(subpopulation.generationTimeYears).toBeGreaterThanOrEqual(2)
      expect(subpopulation.generationTimeYears).toBeLessThanOrEqual(4)
    }
  })

  it('gives every subpopulation 8–15 consecutive census years, some with sexes', async () => {
    const subpopulations = await db.models.Subpopulation.findAll({ include: ['censusCounts'] })
    let sexed = 0
    for (const subpopulation of subpopulations) {
      const years = (subpopulation.censusCounts ?? []).map(row => row.year).sort((a, b) => a - b)
      expect(years.length, subpopulation.name).toBeGreaterThanOrEqual(8)
      expect(years.length, subpopulation.name).toBeLessThanOrEqual(15)
      expect(years.at(-1)! - years[0]! + 1, `${subpopulation.name}: consecutive years`).toBe(years.length)
      if (subpopulation.censusCounts?.some(row => row.males !== null)) sexed += 1
      for (const row of subpopulation.censusCounts ?? []) expect(row.source).toBe('Invented demo data')
    }
    expect(sexed).toBeGreaterThanOrEqual(3)
    expect(sexed).toBeLessThan(subpopulations.length)
  })

  it('gives every subpopulation 1–3 effective-size estimates that agree with their own inputs', async () => {
    const subpopulations = await db.models.Subpopulation.findAll({ include: ['effectiveSizeEstimates', 'censusCounts'] })
    const methods = new Set<string>()
    for (const subpopulation of subpopulations) {
      const estimates = subpopulation.effectiveSizeEstimates ?? []
      expect(estimates.length, subpopulation.name).toBeGreaterThanOrEqual(1)
      expect(estimates.length, subpopulation.name).toBeLessThanOrEqual(3)
      const censusByYear = new Map((subpopulation.censusCounts ?? []).map(row => [row.year, row]))
      for (const estimate of estimates) {
        methods.add(estimate.method)
        expect(estimate.source).toBe('Invented demo data')
        // Independent recomputation of each stored figure (rounded to 0.1 in the data file).
        let expected: number
        if (estimate.method === 'sex-ratio') {
          const { males, females, year } = estimate.inputs as { males: number, females: number, year: number }
          expect(censusByYear.get(year)).toMatchObject({ males, females })
          expected = (4 * males * females) / (males + females)
        } else if (estimate.method === 'harmonic-mean') {
          const { sizes, years } = estimate.inputs as { sizes: number[], years: number[] }
          years.forEach((year, index) => expect(censusByYear.get(year)?.adults).toBe(sizes[index]))
          expected = sizes.length / sizes.reduce((sum, size) => sum + 1 / size, 0)
        } else {
          expect(estimate.method).toBe('ne-n-ratio')
          const { census, ratio, ratioLow, ratioHigh, years } = estimate.inputs as { census: number, ratio: number, ratioLow: number, ratioHigh: number, years: [number, number] }
          const counted = (subpopulation.censusCounts ?? []).filter(row => row.year >= years[0] && row.year <= years[1]).map(row => row.adults)
          expectWithinRounding(census, counted.length / counted.reduce((sum, size) => sum + 1 / size, 0), `${subpopulation.name} harmonic-mean census`)
          expected = census * ratio
          expectWithinRounding(estimate.intervalLow, census * ratioLow, `${subpopulation.name} low`)
          expectWithinRounding(estimate.intervalHigh, census * ratioHigh, `${subpopulation.name} high`)
        }
        expectWithinRounding(estimate.value, expected, `${subpopulation.name} ${estimate.method}`)
      }
      if (subpopulation.workingNe !== null) expect(subpopulation.workingNeReason).toBeTruthy()
    }
    expect([...methods].sort()).toEqual(['harmonic-mean', 'ne-n-ratio', 'sex-ratio'])
  })
})

describe('demo passwords', () => {
  it('verify with nuxt-auth-utils\' own verifyPassword, and a wrong password does not', async () => {
    const authUtilsPassword = await loadAuthUtilsPassword()
    const users = await db.models.User.findAll()
    expect(users).toHaveLength(4)
    for (const user of users) {
      expect(user.passwordHash).toMatch(/^\$scrypt\$n=16384,r=8,p=1\$/)
      expect(await authUtilsPassword.verifyPassword(user.passwordHash!, 'tributary-demo'), user.email).toBe(true)
      expect(await authUtilsPassword.verifyPassword(user.passwordHash!, 'tributary-demo!'), user.email).toBe(false)
    }
    // And the other way round: a hash made by nuxt-auth-utils verifies here.
    const madeBySignIn = await authUtilsPassword.hashPassword('another password')
    expect(await verifyPasswordScrypt(madeBySignIn, 'another password')).toBe(true)
  })

  it('are salted per user', async () => {
    const users = await db.models.User.findAll()
    expect(new Set(users.map(user => user.passwordHash)).size).toBe(users.length)
  })
})

describe('reverting the seeds', () => {
  it('removes the demo agency and everything it owns, and seeding again restores it', async () => {
    const before = await counts(db.sequelize)
    expect(await revertSeeds(db.sequelize)).toEqual({ reverted: seeds.map(seed => seed.name).reverse() })
    expect(Object.values(await counts(db.sequelize))).toEqual(TABLES.map(() => 0))
    await runSeeds(db.sequelize)
    expect(await counts(db.sequelize)).toEqual(before)
  })
})
