/**
 * POST /api/subpopulations/:id/census/import — a census CSV (template: shared/schemas/census.ts),
 * sent either as the file itself (Content-Type text/csv, ?mode=add|replace) or as JSON
 * { csv, mode }. → 201 { created, updated, items } with the whole series after the import.
 *
 * All or nothing, in one transaction: any problem answers 422 with one issue per problem, each
 * naming its spreadsheet row (header = row 1) and column (`path` 'rows.<row>.<column>'), and
 * nothing is stored. mode 'add' (default) refuses years that already have a census (naming the
 * row); 'replace' overwrites them. Over CENSUS_IMPORT_MAX_BYTES → 413 before the body is read.
 * Biologists, managers and administrators of the agency.
 */
import {
  CENSUS_IMPORT_MAX_BYTES,
  CensusImportQuerySchema,
  CensusImportSchema,
  type CensusImportProblem,
  type CensusImportResponse,
} from '#shared/schemas/census'
import { censusCountDto } from '../../../../record/census-dto'
import { parseCensusCsv } from '../../../../record/census-csv'
import { readTextBody } from '../../../../record/read-text-body'
import { findRecordSubpopulation, RECORD_WRITERS } from '../../../../record/record-subpopulation'

function refuse(problems: readonly CensusImportProblem[]) {
  const issues = problems.map(problem => ({
    path: `rows.${problem.row}${problem.column ? `.${problem.column}` : ''}`,
    message: problem.message.startsWith('Row ') ? problem.message : `Row ${problem.row}: ${problem.message}`,
  }))
  const rest = issues.length - 1
  const first = issues[0]?.message ?? 'The file could not be imported.'
  const message = `Nothing was imported. ${first}${rest > 0 ? ` (and ${rest} more problem${rest === 1 ? '' : 's'})` : ''}`
  return unprocessable(message, issues)
}

export default defineEventHandler(async (event): Promise<CensusImportResponse> => {
  const user = await requireRole(event, ...RECORD_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  await findRecordSubpopulation(user, id) // 404 before reading a file meant for another agency's record
  const contentType = String(getRequestHeader(event, 'content-type') ?? '').toLowerCase()
  let csv: string
  let mode: 'add' | 'replace'
  if (contentType.startsWith('text/csv') || contentType.startsWith('text/plain')) {
    mode = getQueryWith(event, CensusImportQuerySchema).mode
    csv = await readTextBody(event, CENSUS_IMPORT_MAX_BYTES)
  } else {
    // JSON escaping can lengthen the text; allow for it in the body limit, then check the CSV itself.
    const body = await readBodyWith(event, CensusImportSchema, { maxBytes: 2 * CENSUS_IMPORT_MAX_BYTES })
    if (Buffer.byteLength(body.csv, 'utf8') > CENSUS_IMPORT_MAX_BYTES) throw payloadTooLarge(CENSUS_IMPORT_MAX_BYTES)
    csv = body.csv
    mode = body.mode
  }

  const parsed = parseCensusCsv(csv)
  if (parsed.problems.length > 0) throw refuse(parsed.problems)

  const { sequelize, models } = await useDb()
  const result = await sequelize.transaction(async (t) => {
    const subpopulation = await findRecordSubpopulation(user, id, { transaction: t, lock: true })
    const existing = await models.CensusCount.findAll({ where: { subpopulationId: id }, transaction: t, lock: t.LOCK.UPDATE })
    const byYear = new Map(existing.map(row => [row.year, row]))
    if (mode === 'add') {
      const clashes = parsed.rows.filter(row => byYear.has(row.data.year))
      if (clashes.length > 0) {
        throw refuse(clashes.map(({ row, data }) => ({
          row,
          column: 'year',
          message: `Row ${row}, year: ${subpopulation.name} already has a census for ${data.year} (${byYear.get(data.year)?.adults} adults). Import with "replace" to overwrite it, or remove the row.`,
        })))
      }
    }
    const created: number[] = []
    const updated: { year: number, before: ReturnType<typeof censusCountDto> }[] = []
    for (const { data } of parsed.rows) {
      const values = {
        adults: data.adults, males: data.males ?? null, females: data.females ?? null,
        method: data.method ?? '', source: data.source ?? '',
      }
      const current = byYear.get(data.year)
      if (current) {
        const before = censusCountDto(current)
        current.set(values)
        if (current.changed()) {
          await current.save({ transaction: t })
          updated.push({ year: data.year, before })
        }
      } else {
        await models.CensusCount.create({ subpopulationId: id, year: data.year, ...values }, { transaction: t })
        created.push(data.year)
      }
    }
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'census.import',
      entityType: 'subpopulation', entityId: id,
      before: updated.length > 0 ? { replaced: updated.map(entry => entry.before) } : null,
      after: { mode, createdYears: created, updatedYears: updated.map(entry => entry.year), rows: parsed.rows.length },
    })
    const items = await models.CensusCount.findAll({ where: { subpopulationId: id }, order: [['year', 'ASC']], transaction: t })
    return { created: created.length, updated: updated.length, items: items.map(censusCountDto) }
  })
  setResponseStatus(event, 201)
  return result
})
