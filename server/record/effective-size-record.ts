/**
 * The effective-size part of a subpopulation record as GET …/effective-sizes answers it: the
 * saved estimates (newest first, with their creators) and the working Ne (with who chose it).
 */
import type { Transaction } from 'sequelize'
import type { EffectiveSizeEstimate, Subpopulation } from '../db/models'
import type { EffectiveSizeListResponse } from '#shared/schemas/effective-size'
import { useDb } from '../utils/db'
import { effectiveSizeEstimateDto, linkedWorkingEstimateId, workingNeDto } from './effective-size-dto'

/** Estimates of a subpopulation with their creators, newest estimate date first. */
export async function estimatesOf(subpopulationId: number, transaction?: Transaction): Promise<EffectiveSizeEstimate[]> {
  const { models } = await useDb()
  return models.EffectiveSizeEstimate.findAll({
    where: { subpopulationId },
    include: [{ model: models.User, as: 'creator', attributes: ['id', 'name'] }],
    order: [['estimatedOn', 'DESC NULLS LAST'], ['id', 'DESC']],
    transaction,
  })
}

export async function loadEffectiveSizeRecord(subpopulation: Subpopulation, transaction?: Transaction): Promise<EffectiveSizeListResponse> {
  const { models } = await useDb()
  const estimates = await estimatesOf(subpopulation.id, transaction)
  const workingId = linkedWorkingEstimateId(subpopulation, estimates)
  const setBy = subpopulation.workingNeSetBy
    ? await models.User.findOne({ where: { id: subpopulation.workingNeSetBy }, attributes: ['id', 'name'], transaction })
    : null
  return {
    items: estimates.map(estimate => effectiveSizeEstimateDto(estimate, workingId)),
    working: workingNeDto(subpopulation, workingId, setBy),
  }
}
