/**
 * Demo seed: an APPROVED genetic-rescue proposal with its whole review trail and the monitoring
 * that followed, so the Reviews page, the timeline and the monitoring chart have
 * something real to show. Invented, like the rest of the demo data.
 *
 * Recipient: Owlfeather Bald (census about 20, working Ne 6, isolated 120 years). Source:
 * Quillmoss Ridge (large, isolated 12 years). Author: the demo biologist; decided by the demo
 * manager (separation of duties). Trail, dated back from the day the seed runs so the demo stays
 * current: started 420 days ago, submitted 400, a question and an answer in the comments, approved
 * 388 days ago with a comment; a pre-move baseline 370 days ago; 6 adults (3 female, 3 male) moved
 * 360 days ago; a follow-up 20 days ago. Each workflow step has its version snapshot; no e-mail is
 * queued (seeding sends no mail). No audit events are written: the audit log records what people
 * did in this installation, and an agency that appears in it can never be deleted, so seeding
 * one would also make the demo impossible to revert. The timeline reads the same story from the
 * rows themselves (created, submitted, decisions, comments, moves, follow-ups).
 *
 * The signed brief is not issued here: the brief service issues it on approval from now on, or
 * on the first download of an already approved proposal (see server/utils/review-brief.ts).
 *
 * Idempotent: the runner records it in `tributary_seeds`, and `up` does nothing when the demo
 * agency is missing or already has a proposal with this title.
 */
import { col, fn, where, type Transaction } from 'sequelize'
import type { MigrationContext } from '../server/db/migrations/context'
import { initModels, type Proposal } from '../server/db/models'
import { proposalDto } from '../server/utils/proposal-dto'
import { emptyNarrative, prefillOutbreedingAnswers, type Checklist, type Narrative } from '../shared/schemas/proposal'
import { BASELINE_SCENARIO_NAME, ScenarioInputsSchema, baselineScenarioInputs, defaultScenarioInputs } from '../shared/schemas/scenario'
import { loadDemoData } from './demo/data'

/** The demo proposal's fixed names (invented). */
export const DEMO_APPROVED_PROPOSAL = {
  title: 'Gene flow for Owlfeather Bald (demo, approved)',
  recipient: 'Owlfeather Bald',
  source: 'Quillmoss Ridge',
  scenario: 'Six adults every seven years',
} as const

const NARRATIVE: Narrative = {
  ...emptyNarrative(),
  rationale: 'Owlfeather Bald has about 20 adults, a working Ne of about 6 and no gene flow for some 120 years (invented demo figures). '
    + 'Without new genes, inbreeding keeps rising by several percent a generation. Quillmoss Ridge is large and was connected to the '
    + 'ridge system until recently, so a few of its adults bring variation the bald has lost. This is a demo proposal with invented data.',
  monitoringPlan: 'Mark every released adult. Count adults each spring; genotype tissue from adults and juveniles one year after each '
    + 'release and then every second year, to follow heterozygosity and inbreeding against the projection (demo text).',
  risksAndMitigations: 'The environments differ (summit spruce-fir forest against grassy bald margin): release only into the forest edge '
    + 'of the bald, and compare survival of released adults with residents in the first year. Disease: chytrid screening before the move.',
  permitsNeeded: 'State scientific collection permit for both sites; landholder consent for the access road (demo text).',
  recommendationReason: 'Six adults every seven years (about two generations) keeps the projected inbreeding below its present level '
    + 'over 50 years while taking less than 1% of the source\'s adults each time.',
}

const CHECKLIST: Checklist = {
  'disease-screening': { done: true, note: 'Chytrid (Bd and Bsal) PCR on skin swabs; any positive stops the move (demo).' },
  'quarantine': { done: true, note: 'Two weeks in the field station, one animal per box (demo).' },
  'husbandry': { done: true },
  'welfare': { done: true, note: 'Reviewed by the agency welfare officer (demo).' },
  'permits': { done: true },
}

const DAY_MS = 86_400_000

/** The seed's clock: a day `daysAgo` before `today`, at `hour`:`minute` UTC. */
function dayAgo(today: Date, daysAgo: number, hour = 10, minute = 0): Date {
  const midnight = Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate())
  return new Date(midnight - daysAgo * DAY_MS + (hour * 60 + minute) * 60_000)
}

const dayText = (date: Date) => date.toISOString().slice(0, 10)

export async function up({ context }: { context: MigrationContext }): Promise<void> {
  const { sequelize, transaction } = context
  const models = initModels(sequelize)
  const { Agency, User, Species, Subpopulation, Proposal, Scenario, ProposalVersion, Decision, Comment, Translocation, MonitoringObservation } = models
  const data = loadDemoData()

  const agency = await Agency.findOne({ where: where(fn('lower', col('name')), data.agency.name.toLowerCase()), transaction })
  if (!agency) return
  if (await Proposal.findOne({ where: { agencyId: agency.id, title: DEMO_APPROVED_PROPOSAL.title }, transaction })) return

  const recipient = await Subpopulation.findOne({ where: { agencyId: agency.id, name: DEMO_APPROVED_PROPOSAL.recipient }, transaction })
  const source = await Subpopulation.findOne({ where: { agencyId: agency.id, name: DEMO_APPROVED_PROPOSAL.source }, transaction })
  const author = await User.findOne({ where: { agencyId: agency.id, role: 'biologist' }, order: [['id', 'ASC']], transaction })
  const manager = await User.findOne({ where: { agencyId: agency.id, role: 'manager' }, order: [['id', 'ASC']], transaction })
  if (!recipient || !source || !author || !manager) return
  const species = await Species.findAll({ where: { agencyId: agency.id }, transaction })
  const speciesName = (id: number) => species.find(row => row.id === id)?.commonName
  const record = (row: typeof recipient) => ({
    name: row.name, speciesId: row.speciesId, speciesName: speciesName(row.speciesId), yearsIsolated: row.yearsIsolated ?? null, environmentClass: row.environmentClass ?? null,
  })

  const today = new Date()
  const at = {
    created: dayAgo(today, 420, 9, 12),
    submitted: dayAgo(today, 400, 16, 40),
    question: dayAgo(today, 396, 11, 5),
    answer: dayAgo(today, 395, 8, 50),
    approved: dayAgo(today, 388, 14, 20),
    baseline: dayAgo(today, 370),
    moved: dayAgo(today, 360),
    followUp: dayAgo(today, 20),
  }

  const proposal = await Proposal.create({
    agencyId: agency.id,
    recipientId: recipient.id,
    title: DEMO_APPROVED_PROPOSAL.title,
    purpose: 'Slow the loss of genetic variation at Owlfeather Bald by moving a few adults from Quillmoss Ridge every two generations (invented demo).',
    authorId: author.id,
    sourceSubpopulationIds: [source.id],
    captiveSource: null,
    narrative: NARRATIVE,
    outbreedingAnswers: prefillOutbreedingAnswers(record(recipient), [record(source)], false),
    checklist: CHECKLIST,
    createdAt: at.created,
    updatedAt: at.created,
  }, { transaction, silent: true })

  await Scenario.create({
    proposalId: proposal.id, name: BASELINE_SCENARIO_NAME, isBaseline: true,
    inputs: baselineScenarioInputs() as unknown as Record<string, unknown>, createdAt: at.created, updatedAt: at.created,
  }, { transaction, silent: true })
  const inputs = ScenarioInputsSchema.parse({
    ...defaultScenarioInputs(source.id),
    schedule: { animalsPerEvent: 6, females: 3, males: 3, intervalYears: 7, events: 3, firstEventYear: 0 },
    recipientOverrides: { initialInbreeding: 0.22 },
    horizonYears: 50,
  })
  const recommended = await Scenario.create({
    proposalId: proposal.id, name: DEMO_APPROVED_PROPOSAL.scenario, isBaseline: false,
    inputs: inputs as unknown as Record<string, unknown>, createdAt: at.created, updatedAt: at.created,
  }, { transaction, silent: true })

  // Version 0 as created, with the recommendation chosen.
  await Proposal.update({ recommendedScenarioId: recommended.id }, { where: { id: proposal.id }, transaction, silent: true })
  proposal.recommendedScenarioId = recommended.id
  await snapshot(transaction, proposal, author.id, [], at.created)

  // Submitted (version 1).
  await moveTo(proposal, { status: 'submitted', submittedAt: at.submitted }, 1, at.submitted)
  await snapshot(transaction, proposal, author.id, ['status', 'submittedAt'], at.submitted)

  // A question from the manager and the biologist's answer (mentions by address).
  await Comment.create({
    proposalId: proposal.id, authorId: manager.id, mentions: [author.id], createdAt: at.question,
    body: `@${author.email} the environments differ (summit forest against bald margin). How will you tell whether released adults do as well as residents?`,
  }, { transaction })
  await Comment.create({
    proposalId: proposal.id, authorId: author.id, mentions: [manager.id], createdAt: at.answer,
    body: `@${manager.email} every released adult is marked; the spring count compares their survival with residents, and the plan stops further releases if it is clearly lower. Added to "Risks and mitigations".`,
  }, { transaction })

  // Approved by the manager (version 2).
  const comment = 'Approved: the schedule is modest for the source, the disease screening and the stop rule are in place. Permits and agency policy govern the move itself.'
  await Decision.create({ proposalId: proposal.id, decidedBy: manager.id, decision: 'approve', comment, createdAt: at.approved }, { transaction })
  await moveTo(proposal, { status: 'approved', decidedAt: at.approved }, 2, at.approved)
  await snapshot(transaction, proposal, manager.id, ['status', 'decidedAt'], at.approved)

  // Monitoring: a baseline before the move, the move, and a follow-up.
  await MonitoringObservation.create({
    proposalId: proposal.id, subpopulationId: recipient.id, observedOn: dayText(at.baseline),
    census: 19, heterozygosity: 0.36, inbreeding: 0.22, source: 'Pre-release survey and genotyping of 14 adults (demo)',
    notes: 'Baseline before the first release (invented figures).', recordedBy: author.id, createdAt: at.baseline, updatedAt: at.baseline,
  }, { transaction, silent: true })
  const animals = [
    { id: 'QR-24-01', sex: 'female' }, { id: 'QR-24-02', sex: 'female' }, { id: 'QR-24-03', sex: 'female' },
    { id: 'QR-24-04', sex: 'male' }, { id: 'QR-24-05', sex: 'male' }, { id: 'QR-24-06', sex: 'male' },
  ] as const
  await Translocation.create({
    proposalId: proposal.id, movedOn: dayText(at.moved), sourceId: source.id, sourceNote: '', recipientId: recipient.id,
    animals: animals.map(animal => ({ ...animal })), notes: 'All six screened negative for chytrid; released at the forest edge of the bald at dusk (demo).',
    recordedBy: author.id, createdAt: at.moved, updatedAt: at.moved,
  }, { transaction, silent: true })
  await MonitoringObservation.create({
    proposalId: proposal.id, subpopulationId: recipient.id, observedOn: dayText(at.followUp),
    census: 24, heterozygosity: 0.4, inbreeding: 0.19, source: 'Spring count and genotyping of 16 adults and 9 juveniles (demo)',
    notes: 'Four of the six released adults were found again; two clutches with a released parent (invented figures).',
    recordedBy: author.id, createdAt: at.followUp, updatedAt: at.followUp,
  }, { transaction, silent: true })

  /** Sets status fields and the version as the workflow routes would have, dated `when`. */
  async function moveTo(row: Proposal, changes: Partial<Pick<Proposal, 'status' | 'submittedAt' | 'decidedAt'>>, version: number, when: Date) {
    await Proposal.update({ ...changes, version, updatedAt: when }, { where: { id: row.id }, transaction, silent: true })
    await row.reload({ transaction })
  }

  async function snapshot(t: Transaction, row: Proposal, savedBy: number, changedFields: string[], when: Date) {
    await ProposalVersion.create({
      proposalId: row.id, version: row.version, snapshot: proposalDto(row) as unknown as Record<string, unknown>,
      changedFields, savedBy, savedAt: when,
    }, { transaction: t })
  }
}

/** Removes the demo proposal (scenarios, history, decision, comments and monitoring go with it). */
export async function down({ context }: { context: MigrationContext }): Promise<void> {
  const { sequelize, transaction } = context
  const { Agency, Proposal } = initModels(sequelize)
  const data = loadDemoData()
  const agency = await Agency.findOne({ where: where(fn('lower', col('name')), data.agency.name.toLowerCase()), transaction })
  if (!agency) return
  await Proposal.destroy({ where: { agencyId: agency.id, title: DEMO_APPROVED_PROPOSAL.title }, transaction })
}
