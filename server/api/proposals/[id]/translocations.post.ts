/**
 * POST /api/proposals/:id/translocations { movedOn, sourceId | null, sourceNote?, recipientId?,
 *   animals: [{ id, sex }], notes? } → 201 TranslocationDto
 *
 * Records a move actually carried out under an approved proposal: the day, each animal (id and
 * sex), the source (one of the agency's subpopulations, or a captive source named in words) and
 * the recipient (default: the proposal's). Audit event in the same transaction.
 *
 * 403 viewers; 404 another agency's proposal; 409 the proposal is not approved; 422 bad input,
 * a subpopulation outside the agency, source = recipient, or a day in the future.
 */
import { MONITORING_RECORDERS, TranslocationCreateSchema, type TranslocationDto } from '#shared/schemas/review'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { translocationDto } from '../../../utils/review-dto'
import { requireApprovedForMonitoring, requireNotInFuture } from '../../../utils/review-monitoring'
import type { InputIssue } from '../../../utils/validate'

export default defineEventHandler(async (event): Promise<TranslocationDto> => {
  const user = await requireRole(event, ...MONITORING_RECORDERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, TranslocationCreateSchema, { maxBytes: 256 * 1024 })
  const { sequelize, models } = await useDb()

  const dto = await sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })
    requireApprovedForMonitoring(proposal)
    requireNotInFuture(input.movedOn, 'movedOn', 'The day of the move')
    const recipientId = input.recipientId ?? proposal.recipientId
    const ids = [recipientId, ...(input.sourceId === null ? [] : [input.sourceId])]
    const found = await models.Subpopulation.findAll({ where: { id: ids, agencyId: user.agencyId }, attributes: ['id', 'name'], transaction: t })
    const byId = new Map(found.map(row => [row.id, row]))
    const issues: InputIssue[] = []
    if (!byId.has(recipientId)) issues.push({ path: 'recipientId', message: `There is no subpopulation ${recipientId} in your agency's records.` })
    if (input.sourceId !== null && !byId.has(input.sourceId)) issues.push({ path: 'sourceId', message: `There is no subpopulation ${input.sourceId} in your agency's records.` })
    if (input.sourceId !== null && input.sourceId === recipientId) issues.push({ path: 'sourceId', message: 'The source cannot be the recipient itself.' })
    if (issues.length > 0) throw unprocessable(summariseIssues(issues), issues)

    const row = await models.Translocation.create({
      proposalId: proposal.id, movedOn: input.movedOn, sourceId: input.sourceId, sourceNote: input.sourceNote,
      recipientId, animals: input.animals, notes: input.notes, recordedBy: user.id,
    }, { transaction: t })
    row.source = input.sourceId === null ? null : byId.get(input.sourceId) ?? null
    row.recipient = byId.get(recipientId)
    row.recorder = await models.User.findByPk(user.id, { attributes: ['id', 'name'], transaction: t }) ?? undefined
    const result = translocationDto(row)
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'translocation.create',
      entityType: 'translocation', entityId: row.id, before: null, after: result,
    })
    return result
  })
  setResponseStatus(event, 201)
  return dto
})
