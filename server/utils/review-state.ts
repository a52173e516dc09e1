/**
 * GET /api/proposals/:id/review and the answer of every workflow action: where the proposal
 * stands, who wrote and reviews it, the latest decision, its revisions, its monitoring status,
 * and what the caller may do now.
 */
import { Op, type Transaction } from 'sequelize'
import type { Proposal } from '../db/models'
import { allowedReviewActions, waitsFor } from '#shared/review/workflow'
import { monitoringStatus, type MonitoringStatus } from '#shared/review/monitoring-status'
import type { ReviewPersonDto, ReviewStateDto } from '#shared/schemas/review'
import type { CurrentUser } from './auth'
import { reviewContextFor } from './review-access'
import { decisionDto, reviewPersonDto } from './review-dto'

/** Today as YYYY-MM-DD (UTC). */
export function todayUtc(now = new Date()): string {
  return now.toISOString().slice(0, 10)
}

/** The monitoring status of one proposal (reads its translocation and observation days). */
export async function proposalMonitoringStatus(proposal: Proposal, transaction?: Transaction): Promise<MonitoringStatus> {
  const { models } = await useDb()
  if (proposal.status !== 'approved') return monitoringStatus({ proposalStatus: proposal.status, movedOn: [], observedOn: [], today: todayUtc() })
  const [moves, observations] = await Promise.all([
    models.Translocation.findAll({ where: { proposalId: proposal.id }, attributes: ['movedOn'], transaction }),
    models.MonitoringObservation.findAll({ where: { proposalId: proposal.id }, attributes: ['observedOn'], transaction }),
  ])
  return monitoringStatus({
    proposalStatus: proposal.status,
    movedOn: moves.map(row => String(row.movedOn)),
    observedOn: observations.map(row => String(row.observedOn)),
    today: todayUtc(),
  })
}

/** Active managers and administrators of the agency who have signed up, except the author. */
export async function reviewerCandidates(proposal: Proposal, transaction?: Transaction): Promise<ReviewPersonDto[]> {
  const { models } = await useDb()
  const rows = await models.User.findAll({
    where: {
      agencyId: proposal.agencyId, role: { [Op.in]: ['manager', 'administrator'] }, active: true,
      passwordHash: { [Op.ne]: null }, id: { [Op.ne]: proposal.authorId },
    },
    attributes: ['id', 'name'],
    order: [['name', 'ASC'], ['id', 'ASC']],
    transaction,
  })
  return rows.map(row => reviewPersonDto(row))
}

/**
 * The review state of `proposal` as `user` sees it.
 *
 * @param proposal - a proposal of the caller's agency (already checked)
 * @param user - the caller
 */
export async function reviewState(proposal: Proposal, user: CurrentUser, transaction?: Transaction): Promise<ReviewStateDto> {
  const { models } = await useDb()
  const [author, reviewer, latestDecision, revisions, monitoring] = await Promise.all([
    models.User.findByPk(proposal.authorId, { attributes: ['id', 'name'], transaction }),
    proposal.reviewerId ? models.User.findByPk(proposal.reviewerId, { attributes: ['id', 'name'], transaction }) : Promise.resolve(null),
    models.Decision.findOne({
      where: { proposalId: proposal.id },
      include: [{ model: models.User, as: 'decider', attributes: ['id', 'name'] }],
      order: [['createdAt', 'DESC'], ['id', 'DESC']],
      transaction,
    }),
    models.Proposal.findAll({
      where: { revisesId: proposal.id, agencyId: proposal.agencyId },
      attributes: ['id', 'title', 'status'],
      order: [['id', 'ASC']],
      transaction,
    }),
    proposalMonitoringStatus(proposal, transaction),
  ])
  const context = reviewContextFor(proposal, user, reviewer?.name ?? null)
  return {
    proposalId: proposal.id,
    title: proposal.title,
    status: proposal.status,
    author: reviewPersonDto(author, proposal.authorId),
    reviewer: reviewer ? reviewPersonDto(reviewer) : null,
    submittedAt: proposal.submittedAt ? new Date(proposal.submittedAt).toISOString() : null,
    decidedAt: proposal.decidedAt ? new Date(proposal.decidedAt).toISOString() : null,
    version: proposal.version,
    allowedActions: allowedReviewActions(context),
    waitsForMe: waitsFor(context),
    latestDecision: latestDecision ? decisionDto(latestDecision) : null,
    revisesId: proposal.revisesId ?? null,
    revisions: revisions.map(row => ({ id: row.id, title: row.title, status: row.status })),
    reviewerChoices: user.role === 'administrator' ? await reviewerCandidates(proposal, transaction) : [],
    monitoring,
  }
}
