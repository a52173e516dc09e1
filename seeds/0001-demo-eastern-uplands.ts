/**
 * Demo seed: the invented "Eastern Uplands Wildlife Service" with four users (one per role,
 * password from agency.json), an invented salamander and its ten subpopulations, each with a
 * census series and effective-size estimates. Everything is invented (seeds/demo/*.json).
 *
 * Idempotent twice over: the seed runner records it in `tributary_seeds`, and `up` does
 * nothing when an agency of the same name already exists.
 */
import { col, fn, where } from 'sequelize'
import { deriveGeometryFigures } from '../server/db/derive-geometry'
import type { MigrationContext } from '../server/db/migrations/context'
import { initModels } from '../server/db/models'
import { hashPasswordScrypt } from '../server/db/password'
import { loadDemoData } from './demo/data'

export async function up({ context }: { context: MigrationContext }): Promise<void> {
  const { sequelize, transaction } = context
  const { Agency, User, Species, Subpopulation, CensusCount, EffectiveSizeEstimate } = initModels(sequelize)
  const data = loadDemoData()

  const existing = await Agency.findOne({ where: where(fn('lower', col('name')), data.agency.name.toLowerCase()), transaction })
  if (existing) return

  const agency = await Agency.create({ ...data.agency, logoStorageKey: null, signingCertificateStorageKey: null }, { transaction })

  const users = []
  for (const user of data.users) {
    users.push(await User.create({
      agencyId: agency.id,
      email: user.email,
      name: user.name,
      role: user.role,
      // A fresh salt per user, as a real sign-up would have.
      passwordHash: await hashPasswordScrypt(data.password),
      lastSignInAt: null,
      invitedAt: null,
    }, { transaction }))
  }
  const biologist = users.find(user => user.role === 'biologist') ?? users[0]

  const species = await Species.create({ agencyId: agency.id, ...data.species }, { transaction })

  for (const record of data.subpopulations) {
    const subpopulation = await Subpopulation.create({
      agencyId: agency.id,
      speciesId: species.id,
      name: record.name,
      geometry: record.geometry,
      ...deriveGeometryFigures(record.geometry),
      environmentClass: record.environmentClass,
      yearsIsolated: record.yearsIsolated,
      generationTimeYears: record.generationTimeYears,
      workingNe: record.workingNe,
      workingNeReason: record.workingNeReason,
      notes: record.notes,
    }, { transaction })

    await CensusCount.bulkCreate(record.census.map(row => ({
      subpopulationId: subpopulation.id,
      year: row.year,
      adults: row.adults,
      males: row.males ?? null,
      females: row.females ?? null,
      method: record.censusMethod,
      source: data.source,
    })), { transaction })

    await EffectiveSizeEstimate.bulkCreate(record.estimates.map(estimate => ({
      subpopulationId: subpopulation.id,
      method: estimate.method,
      inputs: estimate.inputs,
      value: estimate.value,
      intervalLow: estimate.intervalLow ?? null,
      intervalHigh: estimate.intervalHigh ?? null,
      estimatedOn: estimate.estimatedOn,
      source: data.source,
      createdBy: biologist?.id ?? null,
    })), { transaction })
  }
}

/**
 * Removes the demo agency and, by cascade, everything it owns. Refused by the database once
 * the agency has audit history (audit_events is append-only): for fresh demo databases only.
 */
export async function down({ context }: { context: MigrationContext }): Promise<void> {
  const { sequelize, transaction } = context
  const { Agency } = initModels(sequelize)
  const data = loadDemoData()
  await Agency.destroy({ where: where(fn('lower', col('name')), data.agency.name.toLowerCase()), transaction })
}
