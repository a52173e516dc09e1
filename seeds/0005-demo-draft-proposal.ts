/**
 * Demo seed: one draft genetic-rescue proposal in the invented demo agency, so the proposals
 * workspace has something to open. Invented, like the rest of the demo data.
 *
 * Recipient: Fernwhistle Creek — the smallest and longest-isolated demo subpopulation (working
 * Ne 3, isolated 150 years). Source: Lanternmoss Gap — the largest census and the most recently
 * connected (isolated 5 years). Authored by the demo biologist. Scenarios: the automatic
 * "No action" baseline and "Scenario A" with the cited default load (2B = 12, O'Grady et al.
 * 2006; shared/schemas/scenario.ts defaultScenarioInputs). The outbreeding screen is pre-filled
 * from the records exactly as POST /api/proposals does, and version 0 is in the history.
 *
 * Idempotent: the runner records it in `tributary_seeds`, and `up` does nothing when the demo
 * agency is missing or already has a proposal with this title.
 */
import { col, fn, where } from 'sequelize'
import type { MigrationContext } from '../server/db/migrations/context'
import { initModels } from '../server/db/models'
import { proposalDto } from '../server/utils/proposal-dto'
import { emptyNarrative, prefillOutbreedingAnswers, type Checklist, type Narrative } from '../shared/schemas/proposal'
import { BASELINE_SCENARIO_NAME, FIRST_SCENARIO_NAME, baselineScenarioInputs, defaultScenarioInputs } from '../shared/schemas/scenario'
import { loadDemoData } from './demo/data'

/** The demo proposal's fixed names (invented). */
export const DEMO_PROPOSAL = {
  title: 'Genetic rescue for Fernwhistle Creek (demo draft)',
  recipient: 'Fernwhistle Creek',
  source: 'Lanternmoss Gap',
} as const

const NARRATIVE: Narrative = {
  ...emptyNarrative(),
  rationale: 'Fernwhistle Creek has been cut off for about 150 years and its working Ne is about 3 (invented demo figures). '
    + 'Inbreeding is expected to be high and rising. A few adults from Lanternmoss Gap, the largest and most recently connected '
    + 'subpopulation, could restore gene flow. This is a demo draft with invented data.',
  monitoringPlan: 'Mark every released adult; count adults and juveniles each autumn for at least three generations; '
    + 'sample tissue from offspring to follow ancestry and heterozygosity (demo text).',
}

const CHECKLIST: Checklist = {
  'disease-screening': { done: false, note: 'Ask the wildlife health team which chytrid tests apply (demo note).' },
  'permits': { done: false },
}

export async function up({ context }: { context: MigrationContext }): Promise<void> {
  const { sequelize, transaction } = context
  const { Agency, User, Species, Subpopulation, Proposal, Scenario, ProposalVersion } = initModels(sequelize)
  const data = loadDemoData()

  const agency = await Agency.findOne({ where: where(fn('lower', col('name')), data.agency.name.toLowerCase()), transaction })
  if (!agency) return
  if (await Proposal.findOne({ where: { agencyId: agency.id, title: DEMO_PROPOSAL.title }, transaction })) return

  const recipient = await Subpopulation.findOne({ where: { agencyId: agency.id, name: DEMO_PROPOSAL.recipient }, transaction })
  const source = await Subpopulation.findOne({ where: { agencyId: agency.id, name: DEMO_PROPOSAL.source }, transaction })
  const author = await User.findOne({ where: { agencyId: agency.id, role: 'biologist' }, order: [['id', 'ASC']], transaction })
  if (!recipient || !source || !author) return
  const species = await Species.findAll({ where: { agencyId: agency.id }, transaction })
  const speciesName = (id: number) => species.find(row => row.id === id)?.commonName
  const record = (row: typeof recipient) => ({
    name: row.name, speciesId: row.speciesId, speciesName: speciesName(row.speciesId), yearsIsolated: row.yearsIsolated ?? null, environmentClass: row.environmentClass ?? null,
  })

  const proposal = await Proposal.create({
    agencyId: agency.id,
    recipientId: recipient.id,
    title: DEMO_PROPOSAL.title,
    purpose: 'Reduce inbreeding and restore lost genetic variation in Fernwhistle Creek by moving a few adults from Lanternmoss Gap (invented demo).',
    authorId: author.id,
    sourceSubpopulationIds: [source.id],
    captiveSource: null,
    narrative: NARRATIVE,
    outbreedingAnswers: prefillOutbreedingAnswers(record(recipient), [record(source)], false),
    checklist: CHECKLIST,
  }, { transaction })
  await Scenario.create({
    proposalId: proposal.id, name: BASELINE_SCENARIO_NAME, isBaseline: true, inputs: baselineScenarioInputs() as unknown as Record<string, unknown>,
  }, { transaction })
  await Scenario.create({
    proposalId: proposal.id, name: FIRST_SCENARIO_NAME, isBaseline: false, inputs: defaultScenarioInputs(source.id) as unknown as Record<string, unknown>,
  }, { transaction })
  await ProposalVersion.create({
    proposalId: proposal.id,
    version: proposal.version,
    snapshot: proposalDto(proposal) as unknown as Record<string, unknown>,
    changedFields: [],
    savedBy: author.id,
    savedAt: proposal.updatedAt,
  }, { transaction })
}

/** Removes the demo proposal (its scenarios and history go with it). */
export async function down({ context }: { context: MigrationContext }): Promise<void> {
  const { sequelize, transaction } = context
  const { Agency, Proposal } = initModels(sequelize)
  const data = loadDemoData()
  const agency = await Agency.findOne({ where: where(fn('lower', col('name')), data.agency.name.toLowerCase()), transaction })
  if (!agency) return
  await Proposal.destroy({ where: { agencyId: agency.id, title: DEMO_PROPOSAL.title }, transaction })
}
