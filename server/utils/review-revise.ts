/**
 * Starting a revision: a new draft, authored by the caller, that copies a closed proposal
 * (approved, declined or withdrawn) — recipient, sources, purpose, narrative, outbreeding
 * answers, checklist and every scenario (the recommended one stays recommended) — and points at
 * it with `revises_id`. The original stays as it was (an approved proposal stays frozen).
 *
 * Sources that are no longer in the agency's records are dropped (and scenarios that used them
 * lose their source) rather than refusing the revision.
 */
import { Op, type Transaction } from 'sequelize'
import type { Proposal } from '../db/models'
import { REVIEW_LIMITS } from '#shared/schemas/review'
import type { CurrentUser } from './auth'

/** Statuses of a revision that is still being worked on. */
const OPEN_STATUSES = ['draft', 'submitted', 'returned'] as const

/**
 * The default title of a revision: the original's with " (revision)", within the title limit.
 *
 * @example revisionTitle('Translocation to Ashfall Creek') // 'Translocation to Ashfall Creek (revision)'
 */
export function revisionTitle(title: string): string {
  const suffix = ' (revision)'
  const base = title.endsWith(suffix) ? title.slice(0, -suffix.length) : title
  return `${base.slice(0, REVIEW_LIMITS.title - suffix.length)}${suffix}`
}

/** 409 when a revision of `original` is still open (continue that one instead). */
export async function requireNoOpenRevision(original: Proposal, transaction: Transaction): Promise<void> {
  const { models } = await useDb()
  const open = await models.Proposal.findOne({
    where: { revisesId: original.id, agencyId: original.agencyId, status: { [Op.in]: [...OPEN_STATUSES] } },
    attributes: ['id', 'title', 'status'],
    transaction,
  })
  if (open) throw conflict(`A revision of this proposal is already open: "${open.title}" (${open.status}). Continue that one instead.`)
}

/**
 * Creates the revision of `original` inside `transaction` and returns it with the ids of its
 * scenarios (baseline first).
 */
export async function createRevision(transaction: Transaction, original: Proposal, user: CurrentUser, title?: string): Promise<{ revision: Proposal, scenarioIds: number[] }> {
  const { models } = await useDb()
  const wanted = [...(original.sourceSubpopulationIds ?? [])]
  const existing = wanted.length === 0
    ? []
    : await models.Subpopulation.findAll({ where: { id: { [Op.in]: wanted }, agencyId: original.agencyId }, attributes: ['id'], transaction })
  const kept = new Set(existing.map(row => row.id))
  const sources = wanted.filter(id => kept.has(id))

  const revision = await models.Proposal.create({
    agencyId: original.agencyId,
    recipientId: original.recipientId,
    title: title ?? revisionTitle(original.title),
    purpose: original.purpose,
    authorId: user.id,
    sourceSubpopulationIds: sources,
    captiveSource: original.captiveSource ?? null,
    narrative: { ...(original.narrative ?? {}) },
    outbreedingAnswers: { ...(original.outbreedingAnswers ?? {}) },
    checklist: { ...(original.checklist ?? {}) },
    revisesId: original.id,
  }, { transaction })

  const scenarios = await models.Scenario.findAll({ where: { proposalId: original.id }, order: [['isBaseline', 'DESC'], ['id', 'ASC']], transaction })
  const idMap = new Map<number, number>()
  for (const scenario of scenarios) {
    const inputs = { ...(scenario.inputs ?? {}) } as Record<string, unknown>
    if (typeof inputs.sourceSubpopulationId === 'number' && !kept.has(inputs.sourceSubpopulationId)) inputs.sourceSubpopulationId = null
    const copy = await models.Scenario.create({ proposalId: revision.id, name: scenario.name, isBaseline: scenario.isBaseline, inputs }, { transaction })
    idMap.set(scenario.id, copy.id)
  }
  const recommended = original.recommendedScenarioId ? idMap.get(original.recommendedScenarioId) : undefined
  if (recommended !== undefined) {
    revision.recommendedScenarioId = recommended
    // Keep the revision at version 0: this is still its creation.
    await models.Proposal.update({ recommendedScenarioId: recommended }, { where: { id: revision.id }, transaction })
  }
  return { revision, scenarioIds: [...idMap.values()] }
}
