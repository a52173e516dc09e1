/**
 * POST /api/proposals/:id/observations { observedOn, census?, heterozygosity?, inbreeding?,
 *   source, notes? } → 201 ObservationDto
 *
 * Records a follow-up of the recipient of an approved proposal (at least one figure), for the
 * observed-against-projected chart and the monitoring status. Audit event in the same
 * transaction.
 *
 * 403 viewers; 404 another agency's proposal; 409 the proposal is not approved; 422 bad input
 * or a day in the future.
 */
import { MONITORING_RECORDERS, ObservationCreateSchema, type ObservationDto } from '#shared/schemas/review'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { observationDto } from '../../../utils/review-dto'
import { requireApprovedForMonitoring, requireNotInFuture } from '../../../utils/review-monitoring'

export default defineEventHandler(async (event): Promise<ObservationDto> => {
  const user = await requireRole(event, ...MONITORING_RECORDERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, ObservationCreateSchema)
  const { sequelize, models } = await useDb()

  const dto = await sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })
    requireApprovedForMonitoring(proposal)
    requireNotInFuture(input.observedOn, 'observedOn', 'The day of the observation')
    const row = await models.MonitoringObservation.create({
      proposalId: proposal.id, subpopulationId: proposal.recipientId, observedOn: input.observedOn,
      census: input.census ?? null, heterozygosity: input.heterozygosity ?? null, inbreeding: input.inbreeding ?? null,
      source: input.source, notes: input.notes, recordedBy: user.id,
    }, { transaction: t })
    row.recorder = await models.User.findByPk(user.id, { attributes: ['id', 'name'], transaction: t }) ?? undefined
    const result = observationDto(row)
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'monitoring-observation.create',
      entityType: 'monitoring-observation', entityId: row.id, before: null, after: result,
    })
    return result
  })
  setResponseStatus(event, 201)
  return dto
})
