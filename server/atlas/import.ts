/**
 * Storing an import: every record or none. The file is read and checked first (shared/atlas
 * import readers; any problem → 422 listing each feature or row); then, in one transaction,
 * names are compared with the species' existing subpopulations (a clash is a problem unless
 * the caller asked to update), records are created or updated with derived centroid and area,
 * and one audit event is written per record. Any failure rolls the whole import back.
 */
import type { CreationAttributes, Sequelize } from 'sequelize'
import { readCsvImport } from '#shared/atlas/import-csv'
import { readGeoJsonImport } from '#shared/atlas/import-geojson'
import type { ImportReading } from '#shared/atlas/import-geojson'
import { missingGenerationTimeMessage, originIssue, sortIssues } from '#shared/atlas/import-record'
import type { ImportIssue, ImportResponse } from '#shared/atlas/types'
import { deriveGeometryFigures } from '../db/derive-geometry'
import type { Models, Species, Subpopulation } from '../db/models'
import { unprocessable } from '../utils/http-errors'
import { auditSnapshot } from '../utils/audit'
import type { CurrentUser } from '../utils/auth'
import { dtosOf, subpopulationAuditSnapshot } from './subpopulation-dto'

/** "The file has 3 problems; nothing was imported. Row 4: …" */
function importRefusal(issues: readonly ImportIssue[]): ReturnType<typeof unprocessable> {
  const count = issues.length
  const first = issues[0]?.message ?? ''
  return unprocessable(`The file has ${count} ${count === 1 ? 'problem' : 'problems'}; nothing was imported. ${first}`, [...issues])
}

/**
 * Reads and checks an import file. A problem with the file as a whole (not JSON, missing
 * columns, no rows) answers 422 at once; per-feature and per-row problems are reported
 * together with the name checks of importRecords.
 */
export function readImportFile(format: 'geojson' | 'csv', text: string, defaultGenerationTimeYears: number | null, onExisting: 'error' | 'update'): ImportReading {
  // When records may update existing ones, a missing generation time is checked per new record below.
  const options = { defaultGenerationTimeYears, requireGenerationTime: onExisting === 'error' }
  const reading = format === 'csv' ? readCsvImport(text, options) : readGeoJsonImport(text, options)
  if (reading.issues.some(issue => issue.feature === undefined && issue.row === undefined)) throw importRefusal(reading.issues)
  return reading
}

/**
 * Stores checked records in one transaction.
 *
 * @param db - connection and models
 * @param input.onExisting - 'error': a name that exists is a problem; 'update': replace its
 *   boundary and the attributes the file gives
 */
export async function importRecords(
  db: { sequelize: Sequelize, models: Models },
  input: { user: CurrentUser, species: Species, reading: ImportReading, onExisting: 'error' | 'update' },
): Promise<ImportResponse> {
  const { sequelize, models } = db
  const { user, species } = input
  const records = input.reading.records
  return sequelize.transaction(async (transaction) => {
    // One import at a time per species, so two imports cannot both create the same name.
    await sequelize.query('SELECT pg_advisory_xact_lock(:key, :species)', { replacements: { key: 5_0001, species: species.id }, transaction })
    const existing = await models.Subpopulation.findAll({ where: { agencyId: user.agencyId, speciesId: species.id }, transaction, lock: transaction.LOCK.UPDATE })
    const byName = new Map(existing.map(row => [row.name.toLowerCase(), row]))

    // Every problem in one answer: the file's own, names already taken, new records without a generation time.
    const clashes = input.onExisting === 'error' ? records.filter(record => byName.has(record.name.toLowerCase())) : []
    const incomplete = records.filter(record => !byName.has(record.name.toLowerCase()) && record.attributes.generationTimeYears === null)
    const issues = sortIssues([
      ...input.reading.issues,
      ...clashes.map(record => originIssue(record.origin, 'name',
        `a subpopulation named "${byName.get(record.name.toLowerCase())?.name ?? record.name}" already exists for this species (choose to update existing ones to replace its boundary and attributes).`, record.name)),
      ...incomplete.map(record => originIssue(record.origin, 'generationTimeYears', missingGenerationTimeMessage(record.generationTimeLabel), record.name)),
    ])
    if (issues.length) throw importRefusal(issues)

    const touched: Subpopulation[] = []
    const audits: { agencyId: number, actorId: number, action: string, entityType: string, entityId: number, before: Record<string, unknown> | null, after: Record<string, unknown> | null }[] = []
    const fresh: CreationAttributes<Subpopulation>[] = []
    let updated = 0
    for (const record of records) {
      const figures = deriveGeometryFigures(record.geometry)
      const current = byName.get(record.name.toLowerCase())
      if (current) {
        const before = subpopulationAuditSnapshot(current)
        current.geometry = record.geometry
        current.centroidLon = figures.centroidLon
        current.centroidLat = figures.centroidLat
        current.areaKm2 = figures.areaKm2
        for (const field of record.given) {
          if (field === 'environmentClass') current.environmentClass = record.attributes.environmentClass
          if (field === 'generationTimeYears' && record.attributes.generationTimeYears !== null) current.generationTimeYears = record.attributes.generationTimeYears
          if (field === 'yearsIsolated') current.yearsIsolated = record.attributes.yearsIsolated
          if (field === 'notes') current.notes = record.attributes.notes
        }
        if (current.changed()) {
          await current.save({ transaction })
          audits.push({ agencyId: user.agencyId, actorId: user.id, action: 'subpopulation.import-update', entityType: 'subpopulation', entityId: current.id, before: auditSnapshot(before), after: auditSnapshot(subpopulationAuditSnapshot(current)) })
          updated += 1
        }
        touched.push(current)
        continue
      }
      fresh.push({
        agencyId: user.agencyId,
        speciesId: species.id,
        name: record.name,
        geometry: record.geometry,
        ...figures,
        environmentClass: record.attributes.environmentClass,
        yearsIsolated: record.attributes.yearsIsolated,
        // Checked above: new records have a generation time.
        generationTimeYears: record.attributes.generationTimeYears ?? 0,
        notes: record.attributes.notes,
      })
    }
    // One INSERT for all new records (a thousand rows one by one take seconds).
    const inserted = fresh.length ? await models.Subpopulation.bulkCreate(fresh, { transaction, returning: true }) : []
    for (const row of inserted) {
      audits.push({ agencyId: user.agencyId, actorId: user.id, action: 'subpopulation.import-create', entityType: 'subpopulation', entityId: row.id, before: null, after: auditSnapshot(subpopulationAuditSnapshot(row)) })
      touched.push(row)
    }
    const created = inserted.length
    if (audits.length) await models.AuditEvent.bulkCreate(audits, { transaction })
    return { created, updated, items: await dtosOf(sequelize, touched, transaction) }
  })
}
