/**
 * A genetic-rescue proposal as forms and routes accept it — one schema for both — and the
 * shapes the proposal routes answer with:
 *   - ProposalCreateSchema: POST /api/proposals;
 *   - ProposalPatchSchema: PATCH /api/proposals/:id (any subset + the `version` it is based
 *     on; `narrative`, `outbreedingAnswers` and `checklist` are merged key by key into what is
 *     stored, so a form may send only the section that changed);
 *   - ProposalListQuerySchema: GET /api/proposals?status=&recipientId=&mine=true;
 *   - OUTBREEDING_QUESTIONS and PROPOSAL_CHECKLIST_ITEMS: the screen and the checklist as data;
 *   - the DTO types (ProposalDto, ProposalDetailResponse, …).
 *
 * Editing rules (enforced by the server): only 'draft' and 'returned' proposals are editable,
 * by any biologist, manager or administrator of the agency; a stale `version` answers 409
 * naming who saved last and when. An answer of the outbreeding screen that differs from the
 * one the records give needs an `overrideReason`.
 */
import { z } from 'zod'
import type { OutbreedingQuestion } from '../genetics/outbreeding/outbreeding-risk'
import type { ProposalStatus } from '../types/db'
import { PROPOSAL_STATUSES } from '../types/db'
import type { ScenarioDto } from './scenario'
import { RecordVersionSchema } from './subpopulation'

/** Limits of the proposal fields (the messages name them). */
export const PROPOSAL_LIMITS = {
  title: 200,
  purpose: 2000,
  sources: 10,
  captiveSource: 2000,
  narrativeSection: 20_000,
  overrideReason: 2000,
  checklistNote: 2000,
} as const

/** Statuses in which a proposal can be edited. */
export const EDITABLE_PROPOSAL_STATUSES = ['draft', 'returned'] as const satisfies readonly ProposalStatus[]

// ---------------------------------------------------------------------------------------------
// The outbreeding-depression screen (Frankham et al. 2011; SCIENCE.md §7) as data.

/** One question of the screen, in our own words. */
export interface OutbreedingQuestionInfo {
  id: OutbreedingQuestion
  question: string
  /** The answer that keeps the predicted risk low. */
  lowRiskAnswer: boolean
  /** What the server pre-fills the answer from, in words. */
  prefillRule: string
}

/**
 * The four questions of Frankham et al. (2011), "Predicting the probability of outbreeding
 * depression", Conservation Biology 25: 465–475, in screen order; the wording is ours.
 */
export const OUTBREEDING_QUESTIONS: readonly OutbreedingQuestionInfo[] = [
  {
    id: 'sameSpecies',
    question: 'Are the recipient and the source the same species?',
    lowRiskAnswer: true,
    prefillRule: 'Yes when every wild source is recorded under the recipient\'s species; not known for a captive source.',
  },
  {
    id: 'fixedChromosomalDifferences',
    question: 'Do they differ by fixed chromosomal differences (karyotype or ploidy)?',
    lowRiskAnswer: false,
    prefillRule: 'Not in the records: answer from karyotype information.',
  },
  {
    id: 'geneFlowWithin500Years',
    question: 'Have they exchanged genes within the last 500 years?',
    lowRiskAnswer: true,
    prefillRule: 'From "years isolated" of the recipient and each source: yes when all are under 500 years, no when any is 500 or more.',
  },
  {
    id: 'similarEnvironments',
    question: 'Do they live in similar environments?',
    lowRiskAnswer: true,
    prefillRule: 'From the environment class: yes when every source has the recipient\'s class, no when any differs.',
  },
]

/** The ids of the four questions, in screen order. */
export const OUTBREEDING_QUESTION_IDS = ['sameSpecies', 'fixedChromosomalDifferences', 'geneFlowWithin500Years', 'similarEnvironments'] as const satisfies readonly OutbreedingQuestion[]

/** Years of isolation beyond which the screen counts "no gene flow within 500 years". */
export const GENE_FLOW_YEARS = 500

// ---------------------------------------------------------------------------------------------
// The checklist of cautions, as data (our own wording).

export interface ChecklistItem {
  id: string
  label: string
  help: string
}

/** Disease, quarantine, husbandry, welfare and permit cautions a translocation plan covers. */
export const PROPOSAL_CHECKLIST_ITEMS = [
  {
    id: 'disease-screening',
    label: 'Disease screening of the animals to be moved',
    help: 'Which pathogens and parasites are screened for, by whom, and what result stops a move. Consider pathogens the recipient has never met.',
  },
  {
    id: 'quarantine',
    label: 'Quarantine before release',
    help: 'Where and for how long the animals are held apart before release, and who decides they are fit to go.',
  },
  {
    id: 'husbandry',
    label: 'Capture, transport and holding',
    help: 'How animals are caught, carried and held; time in transit; experienced handlers and veterinary cover.',
  },
  {
    id: 'welfare',
    label: 'Animal welfare review',
    help: 'Welfare risks to moved animals and to both populations (stress, injury, social disruption) and how they are kept low; ethics approval where required.',
  },
  {
    id: 'permits',
    label: 'Permits and consultation',
    help: 'Permits for capture, transport and release, landholder and community consultation, and agency sign-off.',
  },
] as const satisfies readonly ChecklistItem[]

export type ChecklistItemId = typeof PROPOSAL_CHECKLIST_ITEMS[number]['id']
export const CHECKLIST_ITEM_IDS = PROPOSAL_CHECKLIST_ITEMS.map(item => item.id) as [ChecklistItemId, ...ChecklistItemId[]]

// ---------------------------------------------------------------------------------------------
// Field schemas.

const idSchema = (label: string) => z.number({ error: `${label} must be chosen by its id (a whole number).` })
  .int(`${label} must be chosen by its id (a whole number).`)
  .positive(`${label} must be chosen by its id (a whole number).`)
  .max(2_147_483_647, `${label} must be chosen by its id (a whole number).`)

const TitleSchema = z.string({ error: 'Enter a title.' }).trim()
  .min(1, 'Enter a title.')
  .max(PROPOSAL_LIMITS.title, `The title has at most ${PROPOSAL_LIMITS.title} characters.`)

const PurposeSchema = z.string({ error: 'The purpose must be text.' }).trim()
  .max(PROPOSAL_LIMITS.purpose, `The purpose has at most ${PROPOSAL_LIMITS.purpose} characters.`)

const SourcesSchema = z.array(idSchema('A source subpopulation'), { error: 'Sources must be a list of subpopulation ids.' })
  .max(PROPOSAL_LIMITS.sources, `Choose at most ${PROPOSAL_LIMITS.sources} source subpopulations.`)
  .refine(ids => new Set(ids).size === ids.length, 'Each source subpopulation may be listed once.')

/** '' and null both mean "no captive source". */
const CaptiveSourceSchema = z.union([
  z.null(),
  z.string({ error: 'The captive source must be text.' }).trim()
    .max(PROPOSAL_LIMITS.captiveSource, `The captive source has at most ${PROPOSAL_LIMITS.captiveSource} characters.`)
    .transform(text => (text === '' ? null : text)),
])

const narrativeText = (label: string) => z.string({ error: `${label} must be text.` })
  .max(PROPOSAL_LIMITS.narrativeSection, `${label} has at most ${PROPOSAL_LIMITS.narrativeSection.toLocaleString('en-US')} characters.`)

/** Narrative sections; in a PATCH each is optional and replaces only itself. */
export const NarrativeSchema = z.strictObject({
  rationale: narrativeText('The rationale'),
  monitoringPlan: narrativeText('The monitoring plan'),
  risksAndMitigations: narrativeText('Risks and mitigations'),
  permitsNeeded: narrativeText('Permits needed'),
  /** Why the recommended scenario is recommended. */
  recommendationReason: narrativeText('The recommendation reason'),
})
export type Narrative = z.output<typeof NarrativeSchema>
export const NARRATIVE_KEYS = Object.keys(NarrativeSchema.shape) as (keyof Narrative)[]

/** An empty narrative (every section ''). */
export function emptyNarrative(): Narrative {
  return { rationale: '', monitoringPlan: '', risksAndMitigations: '', permitsNeeded: '', recommendationReason: '' }
}

/** One answer of the screen: yes / no / not known, where it came from, why it was changed. */
export const OutbreedingAnswerSchema = z.strictObject({
  value: z.union([z.literal(true), z.literal(false), z.literal('unknown')], { error: 'Answer yes, no or not known.' }),
  /** The record field(s) the pre-filled answer came from (set by the server). */
  prefilledFrom: z.string().max(500).optional(),
  /** Why the answer differs from the one the records give (required then). */
  overrideReason: z.string({ error: 'The reason must be text.' }).trim()
    .max(PROPOSAL_LIMITS.overrideReason, `The reason has at most ${PROPOSAL_LIMITS.overrideReason} characters.`)
    .optional(),
})
export type OutbreedingAnswer = z.output<typeof OutbreedingAnswerSchema>

/** All four answers (as stored and returned). */
export const OutbreedingAnswersSchema = z.strictObject({
  sameSpecies: OutbreedingAnswerSchema,
  fixedChromosomalDifferences: OutbreedingAnswerSchema,
  geneFlowWithin500Years: OutbreedingAnswerSchema,
  similarEnvironments: OutbreedingAnswerSchema,
})
export type OutbreedingAnswers = z.output<typeof OutbreedingAnswersSchema>

/** One checklist entry. */
export const ChecklistEntrySchema = z.strictObject({
  done: z.boolean({ error: 'Mark the item done or not done (true / false).' }),
  note: z.string({ error: 'The note must be text.' })
    .max(PROPOSAL_LIMITS.checklistNote, `The note has at most ${PROPOSAL_LIMITS.checklistNote} characters.`)
    .optional(),
})
export type ChecklistEntry = z.output<typeof ChecklistEntrySchema>

/** Checklist entries by item id (only the ids of PROPOSAL_CHECKLIST_ITEMS). */
export const ChecklistSchema = z.partialRecord(
  z.enum(CHECKLIST_ITEM_IDS, { error: `Unknown checklist item; the items are ${CHECKLIST_ITEM_IDS.join(', ')}.` }),
  ChecklistEntrySchema,
)
export type Checklist = z.output<typeof ChecklistSchema>

// ---------------------------------------------------------------------------------------------
// Route schemas.

/** POST /api/proposals */
export const ProposalCreateSchema = z.strictObject({
  title: TitleSchema,
  recipientId: idSchema('The recipient'),
  purpose: PurposeSchema.default(''),
  sourceSubpopulationIds: SourcesSchema.default([]),
  captiveSource: CaptiveSourceSchema.optional(),
}).superRefine((value, context) => {
  if (value.sourceSubpopulationIds.includes(value.recipientId)) {
    context.addIssue({ code: 'custom', path: ['sourceSubpopulationIds'], message: 'The recipient cannot also be a source.' })
  }
})
export type ProposalCreateInput = z.input<typeof ProposalCreateSchema>

/**
 * PATCH /api/proposals/:id — any subset of the fields and the `version` the change is based
 * on. narrative / outbreedingAnswers / checklist are merged key by key.
 */
export const ProposalPatchSchema = z.strictObject({
  title: TitleSchema.optional(),
  purpose: PurposeSchema.optional(),
  sourceSubpopulationIds: SourcesSchema.optional(),
  captiveSource: CaptiveSourceSchema.optional(),
  narrative: NarrativeSchema.partial().optional(),
  outbreedingAnswers: OutbreedingAnswersSchema.partial().optional(),
  checklist: ChecklistSchema.optional(),
  recommendedScenarioId: z.union([z.null(), idSchema('The recommended scenario')]).optional(),
  version: RecordVersionSchema,
})
export type ProposalPatchInput = z.input<typeof ProposalPatchSchema>
export type ProposalPatch = z.output<typeof ProposalPatchSchema>

/** GET /api/proposals — every filter optional; `mine=true` keeps the caller's own. */
export const ProposalListQuerySchema = z.object({
  status: z.enum(PROPOSAL_STATUSES, { error: `Status is one of ${PROPOSAL_STATUSES.join(', ')}.` }).optional(),
  recipientId: z.string({ error: 'recipientId must be a record number, like 42.' })
    .regex(/^\d{1,10}$/, 'recipientId must be a record number, like 42.')
    .transform(Number)
    .pipe(z.number().int().min(1, 'recipientId must be a record number, like 42.').max(2_147_483_647, 'recipientId must be a record number, like 42.'))
    .optional(),
  mine: z.enum(['true', 'false'], { error: 'mine is true or false.' }).transform(text => text === 'true').optional(),
})

/** DELETE /api/proposals/:id[?version=N] — the version is optional; a stale one answers 409. */
export const ProposalDeleteQuerySchema = z.object({
  version: z.string({ error: 'Send the version you loaded (?version=N).' })
    .regex(/^\d{1,10}$/, 'Send the version you loaded (?version=N).')
    .transform(Number)
    .pipe(RecordVersionSchema)
    .optional(),
})

/** Largest value of a PostgreSQL `integer` column. */
const MAX_INTEGER = 2_147_483_647

/** Route parameters `:id` and `:version`. */
export const ProposalIdParamsSchema = z.object({
  id: z.string().regex(/^\d{1,10}$/, 'Must be a record number, like 42.').transform(Number)
    .pipe(z.number().int().min(1, 'Must be a record number, like 42.').max(MAX_INTEGER, 'Must be a record number, like 42.')),
})
export const ProposalVersionParamsSchema = ProposalIdParamsSchema.extend({
  version: z.string().regex(/^\d{1,10}$/, 'The version must be a whole number, like 3.').transform(Number)
    .pipe(z.number().int().min(0, 'The version must be a whole number, like 3.').max(MAX_INTEGER, 'The version must be a whole number, like 3.')),
})

// ---------------------------------------------------------------------------------------------
// DTOs (dates are ISO 8601 strings; the client never sees a model).

/** A person named on a proposal. */
export interface ProposalPersonDto { id: number, name: string }

/** The proposal itself, as every proposal route returns it. */
export interface ProposalDto {
  id: number
  agencyId: number
  recipientId: number
  title: string
  purpose: string
  status: ProposalStatus
  authorId: number
  reviewerId: number | null
  sourceSubpopulationIds: number[]
  captiveSource: string | null
  narrative: Narrative
  outbreedingAnswers: OutbreedingAnswers
  checklist: Checklist
  recommendedScenarioId: number | null
  revisesId: number | null
  submittedAt: string | null
  decidedAt: string | null
  createdAt: string
  updatedAt: string
  /** Send back with PATCH (optimistic locking). */
  version: number
  /** Whether the status allows edits ('draft' or 'returned'); roles are checked separately. */
  editable: boolean
}

/**
 * A subpopulation as a proposal needs it: the record fields the engine and the screen use,
 * with the working effective size resolved like the Atlas (working Ne, else latest estimate,
 * else 0.1 × latest census) and its basis.
 */
export interface ProposalSubpopulationDto {
  id: number
  name: string
  speciesId: number
  speciesName: string
  environmentClass: string | null
  yearsIsolated: number | null
  generationTimeYears: number
  latestCensus: { year: number, adults: number } | null
  /** Ne the projections use, individuals; null when nothing is known. */
  workingNe: number | null
  workingNeBasis: 'working' | 'estimate' | 'census-ratio' | 'none'
  workingNeNote: string
  areaKm2: number | null
  centroid: { lon: number, lat: number } | null
  /** Send back with record edits (optimistic locking of the subpopulation). */
  version: number
}

/** One row of GET /api/proposals. */
export interface ProposalSummaryDto {
  id: number
  title: string
  status: ProposalStatus
  recipient: { id: number, name: string }
  sourceSubpopulationIds: number[]
  captiveSource: string | null
  author: ProposalPersonDto
  scenarioCount: number
  createdAt: string
  updatedAt: string
  version: number
  editable: boolean
}

/** GET /api/proposals */
export interface ProposalListResponse { items: ProposalSummaryDto[] }

/** GET|PATCH /api/proposals/:id, POST /api/proposals (201). */
export interface ProposalDetailResponse {
  proposal: ProposalDto
  recipient: ProposalSubpopulationDto
  sources: ProposalSubpopulationDto[]
  /** The baseline first, then the others in creation order. */
  scenarios: ScenarioDto[]
  author: ProposalPersonDto
  reviewer: ProposalPersonDto | null
  /** The latest saved version (null before the first PATCH). */
  lastSaved: { version: number, savedBy: ProposalPersonDto | null, savedAt: string } | null
}

/** One row of GET /api/proposals/:id/versions (newest first). */
export interface ProposalVersionSummaryDto {
  version: number
  savedBy: ProposalPersonDto | null
  savedAt: string
  /** Top-level proposal fields this save changed. */
  changedFields: string[]
}

/** GET /api/proposals/:id/versions */
export interface ProposalVersionListResponse { items: ProposalVersionSummaryDto[] }

/** GET /api/proposals/:id/versions/:version — the proposal as it was after that save. */
export interface ProposalVersionDto extends ProposalVersionSummaryDto {
  snapshot: ProposalDto
}

// ---------------------------------------------------------------------------------------------
// Pre-filling the outbreeding screen from the records.

/** What the screen reads from a subpopulation record. */
export interface OutbreedingRecord {
  name: string
  speciesId: number
  /** Shown in `prefilledFrom` when given (else the species id). */
  speciesName?: string
  yearsIsolated: number | null
  environmentClass: string | null
}

type ScreenValue = OutbreedingAnswer['value']

/** Combines per-source answers: any risky answer wins, then 'unknown', then the low-risk one. */
function combineAnswers(values: readonly ScreenValue[], lowRiskAnswer: boolean): ScreenValue {
  if (values.length === 0) return 'unknown'
  if (values.some(value => value === !lowRiskAnswer)) return !lowRiskAnswer
  if (values.some(value => value === 'unknown')) return 'unknown'
  return lowRiskAnswer
}

const recorded = (value: number | string | null): string => (value === null ? 'not recorded' : String(value))

/**
 * The screen's answers as the records give them (Frankham et al. 2011 questions; SCIENCE.md
 * §7). Each answer names the record field it came from in `prefilledFrom`:
 *   - sameSpecies: true when every wild source has the recipient's species, false when one
 *     does not (field `species`);
 *   - fixedChromosomalDifferences: always 'unknown' — no record holds karyotypes;
 *   - geneFlowWithin500Years: false when the recipient or a source has been isolated for
 *     500 years or more, true when all are recorded and under 500, else 'unknown' (field
 *     `yearsIsolated`);
 *   - similarEnvironments: true when every source has the recipient's environment class
 *     (compared without case and surrounding spaces), false when one differs, 'unknown' when
 *     a class is missing (field `environmentClass`).
 * Over several sources the riskiest answer wins. A captive source (no record) makes every
 * answer at best 'unknown'; with no source at all every answer is 'unknown'.
 *
 * @param recipient - the recipient's record
 * @param sources - the wild sources' records (0–10)
 * @param hasCaptiveSource - whether a captive / unrecorded source is also used
 * @returns all four answers, each `{ value, prefilledFrom? }`
 * @example prefillOutbreedingAnswers({ name: 'A', speciesId: 1, yearsIsolated: 150, environmentClass: 'seep' }, [{ name: 'B', speciesId: 1, yearsIsolated: 5, environmentClass: 'Seep' }], false).similarEnvironments.value // true
 * @example prefillOutbreedingAnswers({ name: 'A', speciesId: 1, yearsIsolated: 600, environmentClass: null }, [{ name: 'B', speciesId: 1, yearsIsolated: null, environmentClass: 'x' }], false).geneFlowWithin500Years.value // false
 */
export function prefillOutbreedingAnswers(recipient: OutbreedingRecord, sources: readonly OutbreedingRecord[], hasCaptiveSource: boolean): OutbreedingAnswers {
  const captive: ScreenValue[] = hasCaptiveSource ? ['unknown'] : []
  const named = (field: string, values: string[]) => `${field} (${values.join('; ')})`
  const recordsOf = (read: (record: OutbreedingRecord) => string) =>
    [recipient, ...sources].map(record => `${record.name}: ${read(record)}`).concat(hasCaptiveSource ? ['captive source: no record'] : [])

  const sameSpecies = combineAnswers([...sources.map(source => source.speciesId === recipient.speciesId), ...captive], true)
  const geneFlow = combineAnswers([...sources.map((source): ScreenValue => {
    const years = [recipient.yearsIsolated, source.yearsIsolated]
    if (years.some(value => value !== null && value >= GENE_FLOW_YEARS)) return false
    if (years.some(value => value === null)) return 'unknown'
    return true
  }), ...(hasCaptiveSource && recipient.yearsIsolated !== null && recipient.yearsIsolated >= GENE_FLOW_YEARS ? [false as const] : captive)], true)
  const normalise = (text: string | null) => (text === null ? null : text.trim().toLowerCase())
  const similar = combineAnswers([...sources.map((source): ScreenValue => {
    const [a, b] = [normalise(recipient.environmentClass), normalise(source.environmentClass)]
    if (a === null || b === null || a === '' || b === '') return 'unknown'
    return a === b
  }), ...captive], true)

  const withSources = sources.length > 0 || hasCaptiveSource
  return {
    sameSpecies: withSources ? { value: sameSpecies, prefilledFrom: named('species', recordsOf(record => record.speciesName ?? `species ${record.speciesId}`)) } : { value: 'unknown' },
    fixedChromosomalDifferences: { value: 'unknown' },
    geneFlowWithin500Years: withSources ? { value: geneFlow, prefilledFrom: named('yearsIsolated', recordsOf(record => recorded(record.yearsIsolated))) } : { value: 'unknown' },
    similarEnvironments: withSources ? { value: similar, prefilledFrom: named('environmentClass', recordsOf(record => recorded(record.environmentClass))) } : { value: 'unknown' },
  }
}

/** One problem found while merging answers (path relative to the PATCH body). */
export interface OutbreedingAnswerIssue { path: string, message: string }

const answerWords = (value: ScreenValue): string => (value === true ? 'yes' : value === false ? 'no' : 'not known')

/**
 * The stored screen after a change: how the server merges a PATCH of `outbreedingAnswers`
 * and/or a change of the sources into what is stored.
 *
 * Rules (the records win unless an answer is overridden with a reason):
 *   - every answer carries the records' `prefilledFrom` when the records say something;
 *   - an answer that differs from a known record answer ('yes'/'no') needs an
 *     `overrideReason` (issue at `outbreedingAnswers.<question>.overrideReason` otherwise);
 *     an answer equal to the records' drops its reason;
 *   - an answer the records leave 'unknown' may be given freely (e.g. from karyotypes);
 *   - questions not in the patch: an answer that followed the old records follows the new
 *     ones; an override keeps its value and reason while the records still differ; an answer
 *     given where the records said nothing is kept while they still say nothing.
 *
 * @param stored - the answers stored now
 * @param previousRecords - what the records gave before the change (to tell followed answers from given ones)
 * @param currentRecords - what the records give now (prefillOutbreedingAnswers of the new sources)
 * @param patch - the answers sent, if any
 * @returns the answers to store and the issues (store nothing when there are issues)
 * @example mergeOutbreedingAnswers(a, a, a, { similarEnvironments: { value: true } }).issues // [] when the records say 'unknown'
 */
export function mergeOutbreedingAnswers(
  stored: OutbreedingAnswers,
  previousRecords: OutbreedingAnswers,
  currentRecords: OutbreedingAnswers,
  patch: Partial<OutbreedingAnswers> = {},
): { answers: OutbreedingAnswers, issues: OutbreedingAnswerIssue[] } {
  const issues: OutbreedingAnswerIssue[] = []
  const answers = {} as OutbreedingAnswers
  for (const id of OUTBREEDING_QUESTION_IDS) {
    const records = currentRecords[id]
    const build = (value: ScreenValue, reason: string | undefined): OutbreedingAnswer => {
      const answer: OutbreedingAnswer = { value }
      if (records.prefilledFrom !== undefined) answer.prefilledFrom = records.prefilledFrom
      if (records.value !== 'unknown' && value !== records.value && reason) answer.overrideReason = reason
      return answer
    }
    const sent = patch[id]
    if (sent) {
      const reason = sent.overrideReason?.trim() || undefined
      if (records.value !== 'unknown' && sent.value !== records.value && !reason) {
        issues.push({
          path: `outbreedingAnswers.${id}.overrideReason`,
          message: `The records give "${answerWords(records.value)}" here; say why the answer is "${answerWords(sent.value)}".`,
        })
      }
      answers[id] = build(sent.value, reason)
      continue
    }
    const current = stored[id]
    const followedRecords = current.overrideReason === undefined && current.value === previousRecords[id].value
    if (records.value === 'unknown') {
      answers[id] = build(followedRecords ? 'unknown' : current.value, undefined)
    } else if (current.overrideReason !== undefined && current.value !== records.value) {
      answers[id] = build(current.value, current.overrideReason)
    } else {
      answers[id] = build(records.value, undefined)
    }
  }
  return { answers, issues }
}
