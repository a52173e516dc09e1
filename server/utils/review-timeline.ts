/**
 * A proposal's timeline, oldest first: created, submitted (and resubmitted), reviewer changes,
 * decisions with their comments, withdrawals, revisions started, comments with mentions, and
 * after approval the translocations and follow-up observations — each with who and when.
 *
 * Read from the tables that hold each kind (decisions, comments, translocations,
 * monitoring_observations) and, for the workflow steps that have no table of their own (and the
 * signed brief's issue), from the proposal's audit events. Ordinary edits are not listed (the version history has them).
 */
import { Op, type Transaction } from 'sequelize'
import type { AuditEvent, Proposal } from '../db/models'
import type { ReviewPersonDto, TimelineItemDto } from '#shared/schemas/review'
import { peopleByIds, proposalComments } from './review-comments'
import { reviewPersonDto } from './review-dto'

const AUDIT_KINDS = ['proposal.create', 'proposal.submit', 'proposal.withdraw', 'proposal.reviewer', 'proposal.revise', 'brief.issue'] as const

const DECISION_SUMMARY = { approve: 'approved the proposal', return: 'returned the proposal for changes', decline: 'declined the proposal' } as const

const KIND_ORDER: readonly TimelineItemDto['kind'][] = ['created', 'reviewer', 'submitted', 'comment', 'decision', 'brief', 'withdrawn', 'revision', 'translocation', 'observation']

const iso = (date: Date | string) => new Date(date).toISOString()
const text = (value: unknown): string | null => (typeof value === 'string' && value.trim() !== '' ? value : null)

function fromAudit(row: AuditEvent, proposal: Proposal, people: ReadonlyMap<number, ReviewPersonDto>): TimelineItemDto | null {
  const actor = row.actor ? reviewPersonDto(row.actor) : null
  const after = (row.after ?? {}) as Record<string, unknown>
  const base = { key: `audit-${row.id}`, at: iso(row.createdAt), actor }
  switch (row.action) {
    case 'proposal.create': return {
      ...base, kind: 'created', text: null,
      summary: proposal.revisesId ? `started this proposal as a revision of proposal #${proposal.revisesId}` : 'started this proposal',
      ...(proposal.revisesId ? { relatedProposalId: proposal.revisesId } : {}),
    }
    case 'proposal.submit': return { ...base, kind: 'submitted', text: null, summary: after.resubmitted ? 'resubmitted the proposal for review' : 'submitted the proposal for review' }
    case 'proposal.withdraw': return { ...base, kind: 'withdrawn', text: text(after.reason), summary: 'withdrew the proposal' }
    case 'proposal.reviewer': {
      const reviewerId = typeof after.reviewerId === 'number' ? after.reviewerId : null
      const name = reviewerId === null ? null : (people.get(reviewerId)?.name ?? text(after.reviewerName) ?? `user #${reviewerId}`)
      return { ...base, kind: 'reviewer', text: null, summary: name ? `assigned ${name} as reviewer` : 'cleared the reviewer (any manager may decide)' }
    }
    case 'proposal.revise': {
      const revisionId = typeof after.revisionId === 'number' ? after.revisionId : undefined
      return { ...base, kind: 'revision', text: null, summary: `started a revision${revisionId ? ` (proposal #${revisionId})` : ''}`, ...(revisionId ? { relatedProposalId: revisionId } : {}) }
    }
    case 'brief.issue': return {
      ...base, kind: 'brief', text: null,
      summary: `issued the signed brief${typeof after.documentId === 'string' ? ` (document ${after.documentId})` : ''}`,
    }
    default: return null
  }
}

/** The timeline of `proposal` (of the caller's agency — checked by the route). */
export async function proposalTimeline(proposal: Proposal, transaction?: Transaction): Promise<TimelineItemDto[]> {
  const { models } = await useDb()
  const [events, decisions, comments, moves, observations] = await Promise.all([
    models.AuditEvent.findAll({
      where: { agencyId: proposal.agencyId, entityType: 'proposal', entityId: proposal.id, action: { [Op.in]: [...AUDIT_KINDS] } },
      include: [{ model: models.User, as: 'actor', attributes: ['id', 'name'] }],
      order: [['createdAt', 'ASC'], ['id', 'ASC']],
      transaction,
    }),
    models.Decision.findAll({
      where: { proposalId: proposal.id },
      include: [{ model: models.User, as: 'decider', attributes: ['id', 'name'] }],
      order: [['createdAt', 'ASC'], ['id', 'ASC']],
      transaction,
    }),
    proposalComments(proposal, transaction),
    models.Translocation.findAll({
      where: { proposalId: proposal.id },
      include: [{ model: models.User, as: 'recorder', attributes: ['id', 'name'] }, { model: models.Subpopulation, as: 'source', attributes: ['id', 'name'] }],
      order: [['createdAt', 'ASC'], ['id', 'ASC']],
      transaction,
    }),
    models.MonitoringObservation.findAll({
      where: { proposalId: proposal.id },
      include: [{ model: models.User, as: 'recorder', attributes: ['id', 'name'] }],
      order: [['createdAt', 'ASC'], ['id', 'ASC']],
      transaction,
    }),
  ])
  const reviewerIds = events.flatMap((row) => {
    const reviewerId = (row.after as Record<string, unknown> | null)?.reviewerId
    return typeof reviewerId === 'number' ? [reviewerId] : []
  })
  const people = await peopleByIds(reviewerIds, transaction)

  const items: TimelineItemDto[] = []
  for (const row of events) {
    const item = fromAudit(row, proposal, people)
    if (item) items.push(item)
  }
  // Records made without audit events (seeded or imported): the row itself says who and when.
  const missingCreated = !items.some(item => item.kind === 'created')
  const missingSubmitted = proposal.submittedAt && !items.some(item => item.kind === 'submitted')
  if (missingCreated || missingSubmitted) {
    const author = await models.User.findByPk(proposal.authorId, { attributes: ['id', 'name'], transaction })
    const actor = author ? reviewPersonDto(author) : null
    if (missingCreated) items.push({ key: `created-${proposal.id}`, kind: 'created', at: iso(proposal.createdAt), actor, summary: 'started this proposal', text: null })
    if (missingSubmitted && proposal.submittedAt) {
      items.push({ key: `submitted-${proposal.id}`, kind: 'submitted', at: iso(proposal.submittedAt), actor, summary: 'submitted the proposal for review', text: null })
    }
  }
  for (const decision of decisions) {
    items.push({
      key: `decision-${decision.id}`, kind: 'decision', at: iso(decision.createdAt),
      actor: reviewPersonDto(decision.decider, decision.decidedBy),
      summary: DECISION_SUMMARY[decision.decision], text: decision.comment, decision: decision.decision,
    })
  }
  for (const comment of comments) {
    items.push({ key: `comment-${comment.id}`, kind: 'comment', at: comment.createdAt, actor: comment.author, summary: 'commented', text: comment.body, mentions: comment.mentions })
  }
  for (const move of moves) {
    const count = Array.isArray(move.animals) ? move.animals.length : 0
    const from = move.source?.name ?? (move.sourceNote || 'an unrecorded source')
    items.push({
      key: `translocation-${move.id}`, kind: 'translocation', at: iso(move.createdAt), actor: reviewPersonDto(move.recorder, move.recordedBy),
      summary: `recorded the move of ${count} ${count === 1 ? 'animal' : 'animals'} from ${from} on ${move.movedOn}`, text: move.notes || null,
    })
  }
  for (const observation of observations) {
    const figures = [
      observation.census !== null && observation.census !== undefined ? `census ${observation.census}` : null,
      observation.heterozygosity !== null && observation.heterozygosity !== undefined ? `H ${observation.heterozygosity}` : null,
      observation.inbreeding !== null && observation.inbreeding !== undefined ? `F ${observation.inbreeding}` : null,
    ].filter(Boolean).join(', ')
    items.push({
      key: `observation-${observation.id}`, kind: 'observation', at: iso(observation.createdAt), actor: reviewPersonDto(observation.recorder, observation.recordedBy),
      summary: `recorded a follow-up of ${observation.observedOn} (${figures})`, text: observation.notes || null,
    })
  }
  // Same instant (one transaction): the workflow order decides.
  return items.sort((a, b) => (a.at < b.at ? -1 : a.at > b.at ? 1 : KIND_ORDER.indexOf(a.kind) - KIND_ORDER.indexOf(b.kind)))
}
