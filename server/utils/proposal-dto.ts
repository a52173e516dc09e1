/**
 * Proposal and scenario models → the JSON the proposal routes answer with (DTOs of
 * shared/schemas/proposal.ts and shared/schemas/scenario.ts). Routes never return a model.
 *
 * Stored JSONB sections are normalised on the way out: the narrative always has its five
 * sections ('' when empty), the outbreeding answers all four questions ('unknown' when
 * missing) and the checklist only known item ids.
 */
import type { Proposal, Scenario } from '../db/models'
import {
  CHECKLIST_ITEM_IDS, EDITABLE_PROPOSAL_STATUSES, NARRATIVE_KEYS, OUTBREEDING_QUESTION_IDS, emptyNarrative,
  type Checklist, type ChecklistEntry, type Narrative, type OutbreedingAnswer, type OutbreedingAnswers, type ProposalDto,
} from '../../shared/schemas/proposal'
import type { ScenarioDto, ScenarioInputs } from '../../shared/schemas/scenario'
import type { ProposalStatus } from '../../shared/types/db'

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value)
}

const iso = (date: Date | null | undefined): string | null => (date ? new Date(date).toISOString() : null)

/** The five narrative sections of a stored narrative ('' for a missing one). */
export function proposalNarrativeOf(stored: unknown): Narrative {
  const narrative = emptyNarrative()
  if (!isRecord(stored)) return narrative
  for (const key of NARRATIVE_KEYS) {
    const value = stored[key]
    if (typeof value === 'string') narrative[key] = value
  }
  return narrative
}

/** One stored answer, or 'unknown' when it is missing or malformed. */
function answerOf(stored: unknown): OutbreedingAnswer {
  if (!isRecord(stored)) return { value: 'unknown' }
  const value = stored.value
  if (value !== true && value !== false && value !== 'unknown') return { value: 'unknown' }
  const answer: OutbreedingAnswer = { value }
  if (typeof stored.prefilledFrom === 'string') answer.prefilledFrom = stored.prefilledFrom
  if (typeof stored.overrideReason === 'string' && stored.overrideReason !== '') answer.overrideReason = stored.overrideReason
  return answer
}

/** All four answers of a stored screen. */
export function proposalOutbreedingOf(stored: unknown): OutbreedingAnswers {
  const source = isRecord(stored) ? stored : {}
  return Object.fromEntries(OUTBREEDING_QUESTION_IDS.map(id => [id, answerOf(source[id])])) as OutbreedingAnswers
}

/** The known checklist entries of a stored checklist. */
export function proposalChecklistOf(stored: unknown): Checklist {
  const checklist: Checklist = {}
  if (!isRecord(stored)) return checklist
  for (const id of CHECKLIST_ITEM_IDS) {
    const entry = stored[id]
    if (!isRecord(entry) || typeof entry.done !== 'boolean') continue
    const clean: ChecklistEntry = { done: entry.done }
    if (typeof entry.note === 'string') clean.note = entry.note
    checklist[id] = clean
  }
  return checklist
}

/** Whether a proposal in this status may be edited ('draft', 'returned'). */
export function proposalStatusEditable(status: ProposalStatus): boolean {
  return (EDITABLE_PROPOSAL_STATUSES as readonly ProposalStatus[]).includes(status)
}

/** The proposal DTO of a model. */
export function proposalDto(proposal: Proposal): ProposalDto {
  return {
    id: proposal.id,
    agencyId: proposal.agencyId,
    recipientId: proposal.recipientId,
    title: proposal.title,
    purpose: proposal.purpose,
    status: proposal.status,
    authorId: proposal.authorId,
    reviewerId: proposal.reviewerId ?? null,
    sourceSubpopulationIds: [...(proposal.sourceSubpopulationIds ?? [])],
    captiveSource: proposal.captiveSource ?? null,
    narrative: proposalNarrativeOf(proposal.narrative),
    outbreedingAnswers: proposalOutbreedingOf(proposal.outbreedingAnswers),
    checklist: proposalChecklistOf(proposal.checklist),
    recommendedScenarioId: proposal.recommendedScenarioId ?? null,
    revisesId: proposal.revisesId ?? null,
    submittedAt: iso(proposal.submittedAt),
    decidedAt: iso(proposal.decidedAt),
    createdAt: iso(proposal.createdAt) ?? '',
    updatedAt: iso(proposal.updatedAt) ?? '',
    version: proposal.version,
    editable: proposalStatusEditable(proposal.status),
  }
}

/** The scenario DTO of a model (inputs are stored already validated by ScenarioInputsSchema). */
export function scenarioDto(scenario: Scenario): ScenarioDto {
  return {
    id: scenario.id,
    proposalId: scenario.proposalId,
    name: scenario.name,
    isBaseline: scenario.isBaseline,
    inputs: scenario.inputs as unknown as ScenarioInputs,
    createdAt: iso(scenario.createdAt) ?? '',
    updatedAt: iso(scenario.updatedAt) ?? '',
    version: scenario.version,
  }
}

/**
 * Top-level proposal fields whose values differ between two DTOs (deep comparison through
 * JSON; `version`, `updatedAt` and `editable` are ignored).
 *
 * @example changedProposalFields({ ...a, title: 'x' }, { ...a, title: 'y' }) // ['title']
 */
export function changedProposalFields(before: ProposalDto, after: ProposalDto): string[] {
  const ignored = new Set(['version', 'updatedAt', 'editable'])
  return (Object.keys(after) as (keyof ProposalDto)[])
    .filter(key => !ignored.has(key) && JSON.stringify(before[key]) !== JSON.stringify(after[key]))
}
