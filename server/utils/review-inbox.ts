/**
 * The Reviews inbox: the agency's submitted proposals, longest-waiting first, with author,
 * reviewer, recipient and recommendation, marked where they wait for the caller; and the latest
 * decisions.
 */
import { Op } from 'sequelize'
import type { Proposal, Scenario } from '../db/models'
import { reviewVerdict, waitsFor } from '#shared/review/workflow'
import type { ReviewDecidedItemDto, ReviewInboxItemDto, ReviewInboxResponse, ReviewRecommendationDto } from '#shared/schemas/review'
import type { CurrentUser } from './auth'
import { reviewContextFor } from './review-access'
import { decisionDto, reviewPersonDto } from './review-dto'

/** How many recent decisions the inbox lists. */
const RECENT_DECISIONS = 20

const plural = (count: number, one: string, many = `${one}s`) => `${count} ${count === 1 ? one : many}`

/**
 * A release schedule in words.
 *
 * @example scheduleWords({ animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 0 })
 *   // '4 animals (2 female, 2 male) every 5 years, 3 times'
 * @example scheduleWords(null) // 'No animals moved'
 */
export function scheduleWords(schedule: unknown): string {
  if (!schedule || typeof schedule !== 'object') return 'No animals moved'
  const s = schedule as Record<string, unknown>
  const number = (key: string) => (typeof s[key] === 'number' ? s[key] as number : 0)
  const animals = number('animalsPerEvent')
  const events = number('events')
  if (animals <= 0 || events <= 0) return 'No animals moved'
  const sexes = `(${number('females')} female, ${number('males')} male)`
  const when = events === 1 ? 'once' : `every ${plural(number('intervalYears'), 'year')}, ${events} times`
  const start = number('firstEventYear') > 0 ? `, starting in year ${number('firstEventYear')}` : ''
  return `${plural(animals, 'animal')} ${sexes} ${when}${start}`
}

/** Why a submitted proposal does not wait for the caller (null when it does, or when their role never decides). */
function inboxNote(mayDecide: boolean, isAuthor: boolean, otherReviewer: string | null): string | null {
  if (mayDecide) return null
  if (isAuthor) return 'You wrote it'
  if (otherReviewer) return `Assigned to ${otherReviewer}`
  return null
}

/** The recommended scenario of a proposal in the inbox's words (null when none is chosen). */
export function recommendationOf(proposal: Proposal, scenario: Scenario | undefined): ReviewRecommendationDto | null {
  if (!scenario) return null
  const narrative = (proposal.narrative ?? {}) as Record<string, unknown>
  const inputs = (scenario.inputs ?? {}) as Record<string, unknown>
  return {
    scenarioId: scenario.id,
    scenarioName: scenario.name,
    schedule: scheduleWords(inputs.schedule),
    reason: typeof narrative.recommendationReason === 'string' ? narrative.recommendationReason : '',
  }
}

/** The inbox as `user` sees it, at `now`. */
export async function reviewInbox(user: CurrentUser, now = new Date()): Promise<ReviewInboxResponse> {
  const { models } = await useDb()
  const people = [
    { model: models.User, as: 'author', attributes: ['id', 'name'] },
    { model: models.Subpopulation, as: 'recipient', attributes: ['id', 'name'] },
  ]
  const submitted = await models.Proposal.findAll({
    where: { agencyId: user.agencyId, status: 'submitted' },
    include: [...people, { model: models.User, as: 'reviewer', attributes: ['id', 'name'] }],
    order: [['submittedAt', 'ASC'], ['id', 'ASC']],
  })
  const scenarioIds = submitted.flatMap(proposal => (proposal.recommendedScenarioId ? [proposal.recommendedScenarioId] : []))
  const scenarios = scenarioIds.length
    ? await models.Scenario.findAll({ where: { id: { [Op.in]: scenarioIds } } })
    : []
  const scenarioById = new Map(scenarios.map(scenario => [scenario.id, scenario]))

  const waiting: ReviewInboxItemDto[] = submitted.map((proposal) => {
    const context = reviewContextFor(proposal, user, proposal.reviewer?.name ?? null)
    const verdict = reviewVerdict('approve', context)
    const submittedAt = proposal.submittedAt ? new Date(proposal.submittedAt) : now
    return {
      proposalId: proposal.id,
      title: proposal.title,
      status: proposal.status,
      author: reviewPersonDto(proposal.author, proposal.authorId),
      reviewer: proposal.reviewer ? reviewPersonDto(proposal.reviewer) : null,
      recipient: { id: proposal.recipientId, name: proposal.recipient?.name ?? 'Unknown subpopulation' },
      submittedAt: submittedAt.toISOString(),
      waitingMs: Math.max(0, now.getTime() - submittedAt.getTime()),
      recommendation: recommendationOf(proposal, proposal.recommendedScenarioId ? scenarioById.get(proposal.recommendedScenarioId) : undefined),
      waitsForMe: waitsFor(context),
      note: inboxNote(verdict.allowed, context.isAuthor, proposal.reviewerId !== null && proposal.reviewerId !== user.id ? proposal.reviewer?.name ?? 'another reviewer' : null),
    }
  })

  const decisions = await models.Decision.findAll({
    include: [
      { model: models.User, as: 'decider', attributes: ['id', 'name'] },
      { model: models.Proposal, as: 'proposal', required: true, where: { agencyId: user.agencyId }, include: people },
    ],
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: RECENT_DECISIONS,
  })
  const decided: ReviewDecidedItemDto[] = decisions.flatMap((decision) => {
    const proposal = decision.proposal
    if (!proposal) return []
    return [{
      proposalId: proposal.id,
      title: proposal.title,
      status: proposal.status,
      author: reviewPersonDto(proposal.author, proposal.authorId),
      recipient: { id: proposal.recipientId, name: proposal.recipient?.name ?? 'Unknown subpopulation' },
      decision: decisionDto(decision),
    }]
  })

  return { canDecide: user.role === 'manager' || user.role === 'administrator', waiting, decided, now: now.toISOString() }
}
