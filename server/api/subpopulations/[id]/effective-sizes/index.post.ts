/**
 * POST /api/subpopulations/:id/effective-sizes { method, inputs, source?, estimatedOn? }
 * → 201 EffectiveSizeEstimateDto.
 *
 * The server computes the value (and interval) itself with the engine through
 * `computeEffectiveSizeEstimate`, the same function the page uses for the live result; a posted
 * `value` is refused (422, unknown field). For the harmonic mean the adults of the chosen years
 * are read from the stored census (a year without a census, or with 0 adults → 422 naming it),
 * and the stored inputs keep the sizes used and the assumption. Biologists, managers and
 * administrators of the agency.
 */
import {
  computeEffectiveSizeEstimate,
  defaultEstimateSource,
  EffectiveSizeCreateSchema,
  type EffectiveSizeComputation,
  type EffectiveSizeEstimateDto,
} from '#shared/schemas/effective-size'
import { effectiveSizeEstimateDto } from '../../../../record/effective-size-dto'
import { findRecordSubpopulation, RECORD_WRITERS } from '../../../../record/record-subpopulation'

/** Stored with every harmonic-mean estimate, so the assumption travels with the figure. */
const HARMONIC_MEAN_BASIS = 'adult census counts, each census year taken as one generation'

export default defineEventHandler(async (event): Promise<EffectiveSizeEstimateDto> => {
  const user = await requireRole(event, ...RECORD_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, EffectiveSizeCreateSchema, { maxBytes: 32 * 1024 })
  const { sequelize, models } = await useDb()

  const created = await sequelize.transaction(async (t) => {
    await findRecordSubpopulation(user, id, { transaction: t })
    let computation: EffectiveSizeComputation
    let storedInputs: Record<string, unknown>
    if (input.method === 'harmonic-mean') {
      const years = [...input.inputs.years].sort((a, b) => a - b)
      const rows = await models.CensusCount.findAll({ where: { subpopulationId: id, year: years }, transaction: t })
      const adultsByYear = new Map(rows.map(row => [row.year, row.adults]))
      const missing = years.filter(year => !adultsByYear.has(year))
      if (missing.length > 0) {
        throw unprocessable(`No census for ${missing.join(', ')}: choose years that have one.`, [{ path: 'inputs.years', message: `No census for ${missing.join(', ')}.` }])
      }
      const empty = years.filter(year => adultsByYear.get(year) === 0)
      if (empty.length > 0) {
        throw unprocessable(`The ${empty.join(', ')} census counted no adults; the harmonic mean needs counts above 0.`, [{ path: 'inputs.years', message: `The ${empty.join(', ')} census counted no adults.` }])
      }
      const sizes = years.map(year => adultsByYear.get(year) ?? 0)
      computation = { method: 'harmonic-mean', inputs: { years, sizes } }
      storedInputs = { years, sizes, basis: HARMONIC_MEAN_BASIS }
    } else {
      computation = { method: input.method, inputs: input.inputs } as EffectiveSizeComputation
      storedInputs = { ...input.inputs }
    }

    let result: ReturnType<typeof computeEffectiveSizeEstimate>
    try {
      result = computeEffectiveSizeEstimate(computation)
    } catch (error) {
      if (error instanceof RangeError) throw unprocessable(`These inputs are outside what the formula accepts: ${error.message}`, [{ path: 'inputs', message: error.message }])
      throw error
    }

    const estimate = await models.EffectiveSizeEstimate.create({
      subpopulationId: id,
      method: input.method,
      inputs: storedInputs,
      value: result.value,
      intervalLow: result.intervalLow,
      intervalHigh: result.intervalHigh,
      estimatedOn: input.estimatedOn ?? new Date().toISOString().slice(0, 10),
      source: input.source?.trim() || defaultEstimateSource(input),
      createdBy: user.id,
    }, { transaction: t })
    const after = effectiveSizeEstimateDto(Object.assign(estimate, { creator: { id: user.id, name: user.name } }), null)
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'effective-size.create',
      entityType: 'effective_size_estimate', entityId: estimate.id, before: null, after,
    })
    return after
  })
  setResponseStatus(event, 201)
  return created
})
