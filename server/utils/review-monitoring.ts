/**
 * Monitoring after approval: what was moved, the follow-ups, the recipient's census record since,
 * the monitoring status, and the observed-against-projected course (shared/review/
 * monitoring-projection.ts) computed from:
 *   - the recommended scenario (else the first scenario that moves animals): its schedule is the
 *     "planned" course, its load, horizon and recipient overrides apply;
 *   - the recipient at the time of approval: census = the latest count in or before the year of
 *     the decision (else the latest), Ne = the working effective size as the Atlas resolves it,
 *     generation time from the record; F_0 from the scenario's override (else 0);
 *   - H_0 = the earliest observed heterozygosity (else H is shown relative to the start);
 *   - day 0 = the first recorded move (else the approval day).
 */
import { Op, type Transaction } from 'sequelize'
import type { Proposal, Scenario } from '../db/models'
import { monitoringStatus } from '#shared/review/monitoring-status'
import {
  plannedReleases, projectMonitoringCourses, yearsBetween, type MonitoringBasis, type MonitoringProjection, type ReleaseAt,
} from '#shared/review/monitoring-projection'
import { MONITORING_RECORDERS, type MonitoringResponse, type ObservationDto, type TranslocationDto } from '#shared/schemas/review'
import type { CurrentUser } from './auth'
import { loadProposalSubpopulations } from './proposal-subpopulations'
import { observationDto, translocationDto } from './review-dto'
import { todayUtc } from './review-state'

/** Where the recipient's Ne came from, in words. */
const NE_BASIS_WORDS = {
  'working': 'the working Ne on the record',
  'estimate': 'the latest estimate on the record',
  'census-ratio': '0.1 × the latest census',
  'none': 'no figure',
} as const

/** Longest projection drawn, years. */
const MAXIMUM_HORIZON_YEARS = 500

/** 409 unless the proposal is approved (moves and follow-ups are recorded after approval only). */
export function requireApprovedForMonitoring(proposal: Proposal): void {
  if (proposal.status !== 'approved') {
    throw conflict(`Translocations and follow-ups are recorded once the proposal is approved; this one is ${proposal.status}.`)
  }
}

/** 422 when `day` is after today (UTC, with a day's grace for time zones ahead of UTC). */
export function requireNotInFuture(day: string, path: string, what: string): void {
  const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10)
  if (day > tomorrow) throw unprocessable(`${what} cannot be in the future.`, [{ path, message: `${what} cannot be in the future.` }])
}

/** The scenario whose schedule counts as planned: the recommended one, else the first that moves animals. */
function plannedScenario(proposal: Proposal, scenarios: readonly Scenario[]): Scenario | null {
  const recommended = scenarios.find(scenario => scenario.id === proposal.recommendedScenarioId)
  if (recommended) return recommended
  return scenarios.find(scenario => !scenario.isBaseline && (scenario.inputs as Record<string, unknown>)?.schedule) ?? null
}

function numberOr(value: unknown, fallback: number): number {
  return typeof value === 'number' && Number.isFinite(value) ? value : fallback
}

/** The projection, or the reason there is none. */
async function projectionFor(
  proposal: Proposal, moves: readonly TranslocationDto[], observations: readonly ObservationDto[], transaction?: Transaction,
): Promise<{ projection: MonitoringProjection | null, note: string | null }> {
  if (proposal.status !== 'approved') return { projection: null, note: 'The projection is compared with observations once the proposal is approved.' }
  const { models } = await useDb()
  const scenarios = await models.Scenario.findAll({ where: { proposalId: proposal.id }, order: [['isBaseline', 'DESC'], ['id', 'ASC']], transaction })
  const scenario = plannedScenario(proposal, scenarios)
  const inputs = (scenario?.inputs ?? {}) as Record<string, unknown>
  const overrides = (inputs.recipientOverrides ?? {}) as Record<string, unknown>
  const recipient = (await loadProposalSubpopulations(proposal.agencyId, [proposal.recipientId], transaction)).get(proposal.recipientId)
  if (!recipient) return { projection: null, note: 'The recipient is no longer in the records.' }

  const decisionYear = proposal.decidedAt ? new Date(proposal.decidedAt).getUTCFullYear() : new Date().getUTCFullYear()
  const censusAtDecision = await models.CensusCount.findOne({
    where: { subpopulationId: proposal.recipientId, year: { [Op.lte]: decisionYear } },
    order: [['year', 'DESC']],
    transaction,
  })
  const census = numberOr(overrides.census, censusAtDecision?.adults ?? recipient.latestCensus?.adults ?? Number.NaN)
  const effectiveSize = numberOr(overrides.effectiveSize, recipient.workingNe ?? Number.NaN)
  const generationTimeYears = numberOr(overrides.generationTimeYears, recipient.generationTimeYears)
  if (!(census >= 1)) return { projection: null, note: 'The recipient has no census count, so nothing can be projected.' }
  if (!(effectiveSize >= 0.5)) return { projection: null, note: 'The recipient has no working effective size (Ne), so nothing can be projected.' }

  const byDay = [...observations].sort((a, b) => (a.observedOn < b.observedOn ? -1 : 1))
  const firstH = byDay.find(observation => observation.heterozygosity !== null)?.heterozygosity ?? null
  const basis: MonitoringBasis = {
    census, effectiveSize, generationTimeYears,
    initialInbreeding: Math.min(0.999, Math.max(0, numberOr(overrides.initialInbreeding, 0))),
    initialHeterozygosity: firstH,
  }
  const firstMove = [...moves].sort((a, b) => (a.movedOn < b.movedOn ? -1 : 1))[0]
  const approvalDay = (proposal.decidedAt ? new Date(proposal.decidedAt) : new Date()).toISOString().slice(0, 10)
  const startOn = firstMove?.movedOn ?? approvalDay
  const planned = plannedReleases(inputs.schedule as Parameters<typeof plannedReleases>[0])
  const actual: ReleaseAt[] = moves.map(move => ({ yearOffset: yearsBetween(startOn, move.movedOn), animals: move.animals.length }))
  const observed = byDay.map(observation => ({
    yearOffset: yearsBetween(startOn, observation.observedOn), observedOn: observation.observedOn,
    census: observation.census, heterozygosity: observation.heterozygosity, inbreeding: observation.inbreeding, source: observation.source,
  }))
  const lastObserved = Math.max(0, ...observed.map(point => point.yearOffset), ...actual.map(release => release.yearOffset))
  const horizonYears = Math.min(MAXIMUM_HORIZON_YEARS, Math.max(numberOr(inputs.horizonYears, 50), lastObserved + generationTimeYears))

  try {
    const points = projectMonitoringCourses({ basis, planned, actual, horizonYears })
    const notes = [
      `Projected from Ne ${effectiveSize} (${typeof overrides.effectiveSize === 'number' ? 'the scenario\'s figure' : NE_BASIS_WORDS[recipient.workingNeBasis]}), census ${census} and a generation time of ${generationTimeYears} years; F at the start ${basis.initialInbreeding}.`,
      firstH === null
        ? 'No heterozygosity has been observed yet, so H is shown relative to the start (1 = as at the start).'
        : `H at the start is taken as the earliest observed value, ${firstH}.`,
      'Released animals are taken as unrelated to the recipient and breeding like residents; Ne and census are held constant (the census line is the figure the projection assumes).',
    ]
    return {
      projection: {
        startOn, startKind: firstMove ? 'first-translocation' : 'approval', basis,
        scenario: scenario ? { id: scenario.id, name: scenario.name, recommended: scenario.id === proposal.recommendedScenarioId } : null,
        horizonYears, heterozygosityScale: firstH === null ? 'relative' : 'absolute',
        points, observed, plannedReleases: planned, actualReleases: actual, notes,
      },
      note: null,
    }
  } catch (error) {
    if (error instanceof RangeError) return { projection: null, note: `The recipient's figures are outside what the projection handles: ${error.message}` }
    throw error
  }
}

/** Translocations of a proposal, by day. */
export async function proposalTranslocations(proposal: Proposal, transaction?: Transaction): Promise<TranslocationDto[]> {
  const { models } = await useDb()
  const rows = await models.Translocation.findAll({
    where: { proposalId: proposal.id },
    include: [
      { model: models.Subpopulation, as: 'source', attributes: ['id', 'name'] },
      { model: models.Subpopulation, as: 'recipient', attributes: ['id', 'name'] },
      { model: models.User, as: 'recorder', attributes: ['id', 'name'] },
    ],
    order: [['movedOn', 'ASC'], ['id', 'ASC']],
    transaction,
  })
  return rows.map(translocationDto)
}

/** Follow-up observations of a proposal, by day. */
export async function proposalObservations(proposal: Proposal, transaction?: Transaction): Promise<ObservationDto[]> {
  const { models } = await useDb()
  const rows = await models.MonitoringObservation.findAll({
    where: { proposalId: proposal.id },
    include: [{ model: models.User, as: 'recorder', attributes: ['id', 'name'] }],
    order: [['observedOn', 'ASC'], ['id', 'ASC']],
    transaction,
  })
  return rows.map(observationDto)
}

/** Everything the monitoring section shows, as `user` sees it. */
export async function proposalMonitoring(proposal: Proposal, user: CurrentUser): Promise<MonitoringResponse> {
  const { models } = await useDb()
  const sourceIds = [...(proposal.sourceSubpopulationIds ?? [])]
  const [translocations, observations, recipient, sources] = await Promise.all([
    proposalTranslocations(proposal),
    proposalObservations(proposal),
    models.Subpopulation.findByPk(proposal.recipientId, { attributes: ['id', 'name'] }),
    sourceIds.length
      ? models.Subpopulation.findAll({ where: { id: { [Op.in]: sourceIds }, agencyId: proposal.agencyId }, attributes: ['id', 'name'], order: [['name', 'ASC']] })
      : Promise.resolve([]),
  ])
  const startYear = Number((translocations[0]?.movedOn ?? (proposal.decidedAt ? new Date(proposal.decidedAt).toISOString() : todayUtc())).slice(0, 4))
  const census = proposal.status === 'approved'
    ? await models.CensusCount.findAll({ where: { subpopulationId: proposal.recipientId, year: { [Op.gte]: startYear } }, order: [['year', 'ASC']] })
    : []
  const { projection, note } = await projectionFor(proposal, translocations, observations)
  return {
    proposalId: proposal.id,
    proposalStatus: proposal.status,
    status: monitoringStatus({
      proposalStatus: proposal.status,
      movedOn: translocations.map(move => move.movedOn),
      observedOn: observations.map(observation => observation.observedOn),
      today: todayUtc(),
    }),
    recipient: { id: proposal.recipientId, name: recipient?.name ?? 'Unknown subpopulation' },
    sources: sources.map(row => ({ id: row.id, name: row.name })),
    captiveSource: proposal.captiveSource ?? null,
    translocations,
    observations,
    recordCensus: census.map(row => ({ year: row.year, adults: row.adults })),
    projection,
    projectionNote: note,
    canRecord: (MONITORING_RECORDERS as readonly string[]).includes(user.role) && proposal.status === 'approved',
  }
}
