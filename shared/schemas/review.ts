/**
 * Review, audit and monitoring: what the routes accept (one zod schema for the form and the
 * route) and the shapes they answer with.
 *
 * Routes (server/api/proposals/[id]/…, server/api/reviews, server/api/audit):
 *   - POST /api/proposals/:id/submit      ProposalSubmitSchema   → ReviewStateDto
 *   - POST /api/proposals/:id/decision    DecisionSchema         → ReviewStateDto
 *   - POST /api/proposals/:id/withdraw    WithdrawSchema         → ReviewStateDto
 *   - POST /api/proposals/:id/revise      ReviseSchema           → 201 ReviseResponse
 *   - PUT  /api/proposals/:id/reviewer    ReviewerAssignSchema   → ReviewStateDto
 *   - GET  /api/proposals/:id/review                             → ReviewStateDto
 *   - GET|POST /api/proposals/:id/comments  CommentCreateSchema  → CommentListResponse | 201 CommentDto
 *   - GET  /api/proposals/:id/timeline                           → TimelineResponse
 *   - GET|POST /api/proposals/:id/translocations  TranslocationCreateSchema → TranslocationListResponse | 201 TranslocationDto
 *   - POST /api/proposals/:id/observations  ObservationCreateSchema → 201 ObservationDto
 *   - GET  /api/proposals/:id/monitoring                         → MonitoringResponse
 *   - GET  /api/reviews                                          → ReviewInboxResponse
 *   - GET  /api/audit?…  AuditQuerySchema                        → AuditPageResponse
 *   - GET  /api/audit/export.csv?…  AuditQuerySchema (no page)   → text/csv
 */
import { z } from 'zod'
import { DECISION_KINDS, type DecisionKind, type ProposalStatus, type Role } from '../types/db'
import type { ReviewAction } from '../review/workflow'
import type { MonitoringStatus } from '../review/monitoring-status'
import type { MonitoringProjection } from '../review/monitoring-projection'
import { RecordVersionSchema } from './subpopulation'

/** Limits of the free-text fields (the messages name them). */
export const REVIEW_LIMITS = {
  comment: 5000,
  decisionComment: 5000,
  withdrawReason: 2000,
  mentions: 20,
  animals: 500,
  animalId: 60,
  sourceNote: 500,
  notes: 5000,
  observationSource: 500,
  title: 200,
} as const

const idSchema = (label: string) => z.number({ error: `${label} must be chosen by its id (a whole number).` })
  .int(`${label} must be chosen by its id (a whole number).`)
  .positive(`${label} must be chosen by its id (a whole number).`)
  .max(2_147_483_647, `${label} must be chosen by its id (a whole number).`)

/** A calendar date, YYYY-MM-DD (a real one). */
export const CalendarDateSchema = z.string({ error: 'Enter a date like 2025-03-01.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter a date like 2025-03-01.')
  .refine(text => !Number.isNaN(Date.parse(`${text}T00:00:00Z`)) && new Date(`${text}T00:00:00Z`).toISOString().startsWith(text), 'Enter a real date, like 2025-03-01.')
  .refine(text => text >= '1900-01-01' && text <= '2200-12-31', 'Enter a date between 1900 and 2200.')

// ---------------------------------------------------------------------------------------------
// Workflow.

/** POST /api/proposals/:id/submit — optionally the version you saw and a reviewer to ask. */
export const ProposalSubmitSchema = z.strictObject({
  version: RecordVersionSchema.optional(),
  reviewerId: z.union([z.null(), idSchema('The reviewer')]).optional(),
})
export type ProposalSubmitInput = z.input<typeof ProposalSubmitSchema>

/** POST /api/proposals/:id/decision — always with a comment saying why. */
export const DecisionSchema = z.strictObject({
  decision: z.enum(DECISION_KINDS, { error: 'Choose approve, return or decline.' }),
  comment: z.string({ error: 'Write a comment that explains the decision.' }).trim()
    .min(1, 'Write a comment that explains the decision.')
    .max(REVIEW_LIMITS.decisionComment, `The comment has at most ${REVIEW_LIMITS.decisionComment.toLocaleString('en-US')} characters.`),
  version: RecordVersionSchema.optional(),
})
export type DecisionInput = z.input<typeof DecisionSchema>

/** POST /api/proposals/:id/withdraw */
export const WithdrawSchema = z.strictObject({
  reason: z.string({ error: 'The reason must be text.' }).trim()
    .max(REVIEW_LIMITS.withdrawReason, `The reason has at most ${REVIEW_LIMITS.withdrawReason.toLocaleString('en-US')} characters.`)
    .optional(),
  version: RecordVersionSchema.optional(),
})

/** POST /api/proposals/:id/revise — the new draft's title (default: the old title + " (revision)"). */
export const ReviseSchema = z.strictObject({
  title: z.string({ error: 'Enter a title.' }).trim()
    .min(1, 'Enter a title.')
    .max(REVIEW_LIMITS.title, `The title has at most ${REVIEW_LIMITS.title} characters.`)
    .optional(),
})

/** PUT /api/proposals/:id/reviewer — null lets any manager decide. */
export const ReviewerAssignSchema = z.strictObject({
  reviewerId: z.union([z.null(), idSchema('The reviewer')], { error: 'Choose a reviewer, or null for any manager.' }),
})

// ---------------------------------------------------------------------------------------------
// Comments.

/**
 * POST /api/proposals/:id/comments. People are mentioned by writing `@their.email@agency.example`
 * in the body, or by id in `mentions`; each mentioned person of the agency gets an e-mail.
 */
export const CommentCreateSchema = z.strictObject({
  body: z.string({ error: 'Write a comment.' }).trim()
    .min(1, 'Write a comment.')
    .max(REVIEW_LIMITS.comment, `A comment has at most ${REVIEW_LIMITS.comment.toLocaleString('en-US')} characters.`),
  mentions: z.array(idSchema('A mentioned person'), { error: 'Mentions must be a list of user ids.' })
    .max(REVIEW_LIMITS.mentions, `Mention at most ${REVIEW_LIMITS.mentions} people in one comment.`)
    .optional(),
})
export type CommentCreateInput = z.input<typeof CommentCreateSchema>

/**
 * E-mail addresses written as mentions in a comment: `@` + address, at the start or after a
 * space or bracket, lower-cased, each once, in order.
 *
 * @example mentionedEmails('Thanks @ann@x.test and (@Bo@y.test), not mail@z.test') // ['ann@x.test', 'bo@y.test']
 * @example mentionedEmails('no mentions') // []
 */
export function mentionedEmails(body: string): string[] {
  const found: string[] = []
  for (const match of body.matchAll(/(?:^|[\s(,;])@([^\s@(),;<>]+@[^\s@(),;<>]+\.[^\s@(),;<>]*[^\s@(),;<>.:!?])/g)) {
    const email = (match[1] ?? '').toLowerCase()
    if (email && !found.includes(email)) found.push(email)
  }
  return found
}

// ---------------------------------------------------------------------------------------------
// Monitoring.

export const ANIMAL_SEXES = ['female', 'male', 'unknown'] as const
export type AnimalSexValue = typeof ANIMAL_SEXES[number]

const MovedAnimalSchema = z.strictObject({
  id: z.string({ error: 'Give each animal its id (tag, transponder …).' }).trim()
    .min(1, 'Give each animal its id (tag, transponder …).')
    .max(REVIEW_LIMITS.animalId, `An animal id has at most ${REVIEW_LIMITS.animalId} characters.`),
  sex: z.enum(ANIMAL_SEXES, { error: 'Sex is female, male or unknown.' }),
})

const NotesSchema = z.string({ error: 'Notes must be text.' }).trim()
  .max(REVIEW_LIMITS.notes, `Notes have at most ${REVIEW_LIMITS.notes.toLocaleString('en-US')} characters.`)

/**
 * POST /api/proposals/:id/translocations — one move as it was carried out. The source is one
 * of the agency's subpopulations (`sourceId`) or, for a captive or other unrecorded source,
 * `sourceId: null` with `sourceNote`; the recipient defaults to the proposal's recipient.
 */
export const TranslocationCreateSchema = z.strictObject({
  movedOn: CalendarDateSchema,
  sourceId: z.union([z.null(), idSchema('The source')], { error: 'Choose the source subpopulation, or null for a captive source.' }),
  sourceNote: z.string({ error: 'The source note must be text.' }).trim()
    .max(REVIEW_LIMITS.sourceNote, `The source note has at most ${REVIEW_LIMITS.sourceNote} characters.`)
    .default(''),
  recipientId: idSchema('The recipient').optional(),
  animals: z.array(MovedAnimalSchema, { error: 'List the animals moved.' })
    .min(1, 'List at least one animal moved.')
    .max(REVIEW_LIMITS.animals, `At most ${REVIEW_LIMITS.animals} animals in one record.`),
  notes: NotesSchema.default(''),
}).superRefine((value, context) => {
  if (value.sourceId === null && value.sourceNote === '') {
    context.addIssue({ code: 'custom', path: ['sourceNote'], message: 'Name the captive or other source the animals came from.' })
  }
  if (value.sourceId !== null && value.recipientId !== undefined && value.sourceId === value.recipientId) {
    context.addIssue({ code: 'custom', path: ['sourceId'], message: 'The source cannot be the recipient itself.' })
  }
  const seen = new Set<string>()
  value.animals.forEach((animal, index) => {
    const key = animal.id.toLowerCase()
    if (seen.has(key)) context.addIssue({ code: 'custom', path: ['animals', index, 'id'], message: `Animal ${animal.id} is listed twice.` })
    seen.add(key)
  })
})
export type TranslocationCreateInput = z.input<typeof TranslocationCreateSchema>

const optionalFigure = <T extends z.ZodType>(schema: T) => schema.nullable().optional()

/** POST /api/proposals/:id/observations — a follow-up of the recipient: at least one figure. */
export const ObservationCreateSchema = z.strictObject({
  observedOn: CalendarDateSchema,
  census: optionalFigure(z.number({ error: 'The census is a whole number of adults.' })
    .int('The census is a whole number of adults.').min(0, 'The census cannot be negative.').max(10_000_000, 'The census is at most 10,000,000.')),
  heterozygosity: optionalFigure(z.number({ error: 'Heterozygosity is a number from 0 to 1.' })
    .min(0, 'Heterozygosity is a number from 0 to 1.').max(1, 'Heterozygosity is a number from 0 to 1.')),
  inbreeding: optionalFigure(z.number({ error: 'Inbreeding F is a number between −1 and 1.' })
    .gt(-1, 'Inbreeding F is a number between −1 and 1.').lt(1, 'Inbreeding F is a number between −1 and 1.')),
  source: z.string({ error: 'Say where the figures come from (survey, genotyping report …).' }).trim()
    .min(1, 'Say where the figures come from (survey, genotyping report …).')
    .max(REVIEW_LIMITS.observationSource, `The source has at most ${REVIEW_LIMITS.observationSource} characters.`),
  notes: NotesSchema.default(''),
}).superRefine((value, context) => {
  if ((value.census ?? null) === null && (value.heterozygosity ?? null) === null && (value.inbreeding ?? null) === null) {
    context.addIssue({ code: 'custom', path: ['census'], message: 'Enter at least one figure: census, heterozygosity or inbreeding.' })
  }
})
export type ObservationCreateInput = z.input<typeof ObservationCreateSchema>

// ---------------------------------------------------------------------------------------------
// Audit log.

const wholeNumberQuery = (label: string) => z.string({ error: `${label} must be a whole number.` })
  .regex(/^\d{1,10}$/, `${label} must be a whole number.`)
  .transform(Number)

const blankIsAbsent = (value: unknown) => (value === '' ? undefined : value)

/** GET /api/audit and /api/audit/export.csv: every filter optional; dates inclusive (UTC days). */
export const AuditQuerySchema = z.object({
  entityType: z.preprocess(blankIsAbsent, z.string().trim().regex(/^[a-z][a-z0-9_-]{0,59}$/, 'The record type is a word like proposal or user.').optional()),
  entityId: z.preprocess(blankIsAbsent, wholeNumberQuery('The record id').optional()),
  actorId: z.preprocess(blankIsAbsent, wholeNumberQuery('The person').optional()),
  action: z.preprocess(blankIsAbsent, z.string().trim().regex(/^[a-z][a-z0-9_.-]{0,79}$/, 'The action is a word like proposal.decide.').optional()),
  from: z.preprocess(blankIsAbsent, CalendarDateSchema.optional()),
  to: z.preprocess(blankIsAbsent, CalendarDateSchema.optional()),
  page: z.preprocess(blankIsAbsent, z.coerce.number({ error: 'Must be a page number, like 2.' })
    .int('Must be a whole page number, like 2.').min(1, 'Pages start at 1.').max(100_000, 'That page is too far.').default(1)),
}).superRefine((value, context) => {
  if (value.from && value.to && value.from > value.to) {
    context.addIssue({ code: 'custom', path: ['to'], message: 'The end date is before the start date.' })
  }
  if (value.entityId !== undefined && !value.entityType) {
    context.addIssue({ code: 'custom', path: ['entityType'], message: 'Choose the record type for a record id.' })
  }
})
export type AuditQuery = z.output<typeof AuditQuerySchema>

/** The audit page's filter form as the page address holds it ('' = no filter). */
export interface AuditFilterValues { entityType: string, entityId: string, actorId: string, action: string, from: string, to: string }

// ---------------------------------------------------------------------------------------------
// DTOs (dates are ISO 8601 strings; days are YYYY-MM-DD).

/** A person as review screens name them. */
export interface ReviewPersonDto { id: number, name: string }

export interface DecisionDto {
  id: number
  proposalId: number
  decision: DecisionKind
  comment: string
  decidedBy: ReviewPersonDto
  createdAt: string
}

/** Where a proposal stands in the workflow, and what the caller may do with it. */
export interface ReviewStateDto {
  proposalId: number
  title: string
  status: ProposalStatus
  author: ReviewPersonDto
  reviewer: ReviewPersonDto | null
  submittedAt: string | null
  decidedAt: string | null
  /** The proposal's version (send it back with workflow actions). */
  version: number
  /** Actions the caller may take now (the server checks again). */
  allowedActions: ReviewAction[]
  /** Whether it waits for the caller's decision. */
  waitsForMe: boolean
  latestDecision: DecisionDto | null
  /** The proposal this one revises, and the revisions started from this one. */
  revisesId: number | null
  revisions: { id: number, title: string, status: ProposalStatus }[]
  /** People who may be assigned as reviewer (active managers and administrators, not the author); for administrators only, else []. */
  reviewerChoices: ReviewPersonDto[]
  monitoring: MonitoringStatus
}

/** POST /api/proposals/:id/revise — the new draft and its review state. */
export interface ReviseResponse { proposalId: number, review: ReviewStateDto }

export interface CommentDto {
  id: number
  proposalId: number
  body: string
  author: ReviewPersonDto
  mentions: ReviewPersonDto[]
  createdAt: string
}

export interface CommentListResponse { items: CommentDto[] }

/** Kinds of timeline entries. */
export const TIMELINE_KINDS = ['created', 'submitted', 'decision', 'brief', 'withdrawn', 'reviewer', 'revision', 'comment', 'translocation', 'observation'] as const
export type TimelineKind = typeof TIMELINE_KINDS[number]

/** One entry of a proposal's timeline. */
export interface TimelineItemDto {
  /** Unique within the timeline ('comment-12', 'audit-40' …). */
  key: string
  kind: TimelineKind
  at: string
  actor: ReviewPersonDto | null
  /** One line saying what happened. */
  summary: string
  /** The comment, decision comment or reason, when there is one. */
  text: string | null
  decision?: DecisionKind
  mentions?: ReviewPersonDto[]
  /** For 'revision': the other proposal. */
  relatedProposalId?: number
}

/** GET /api/proposals/:id/timeline — oldest first, and who can be mentioned in a new comment. */
export interface TimelineResponse {
  items: TimelineItemDto[]
  /** Active people of the agency (the comment form's mention choices). */
  people: ReviewPersonDto[]
}

/** The recommendation as a reviewer sees it in the inbox. */
export interface ReviewRecommendationDto {
  scenarioId: number
  scenarioName: string
  /** "4 animals (2 female, 2 male) every 5 years, 3 times" or "No animals moved". */
  schedule: string
  reason: string
}

/** One proposal of the Reviews inbox. */
export interface ReviewInboxItemDto {
  proposalId: number
  title: string
  status: ProposalStatus
  author: ReviewPersonDto
  reviewer: ReviewPersonDto | null
  recipient: { id: number, name: string }
  submittedAt: string
  /** Whole milliseconds since submission when the list was made (server clock). */
  waitingMs: number
  recommendation: ReviewRecommendationDto | null
  waitsForMe: boolean
  /** Why it does not wait for the caller, when it does not ('You wrote it', 'Assigned to …'). */
  note: string | null
}

/** A recent decision in the inbox. */
export interface ReviewDecidedItemDto {
  proposalId: number
  title: string
  status: ProposalStatus
  author: ReviewPersonDto
  recipient: { id: number, name: string }
  decision: DecisionDto
}

/** GET /api/reviews */
export interface ReviewInboxResponse {
  /** Whether the caller's role decides at all. */
  canDecide: boolean
  /** Submitted proposals, longest-waiting first. */
  waiting: ReviewInboxItemDto[]
  /** The latest decisions, newest first (at most 20). */
  decided: ReviewDecidedItemDto[]
  /** Server time the list was made (ISO). */
  now: string
}

/** One audit event for administrators. */
export interface AuditEventDto {
  id: number
  action: string
  entityType: string
  entityId: number | null
  actor: (ReviewPersonDto & { email: string }) | null
  before: Record<string, unknown> | null
  after: Record<string, unknown> | null
  createdAt: string
}

/** GET /api/audit */
export interface AuditPageResponse {
  items: AuditEventDto[]
  page: number
  pageSize: number
  total: number
  /** Record types and actions present in the agency's log (for the filters). */
  entityTypes: string[]
  actions: string[]
  /** People who appear as actors in the log. */
  actors: (ReviewPersonDto & { email: string })[]
}

export interface MovedAnimalDto { id: string, sex: AnimalSexValue }

export interface TranslocationDto {
  id: number
  proposalId: number
  movedOn: string
  source: { id: number, name: string } | null
  sourceNote: string
  recipient: { id: number, name: string }
  animals: MovedAnimalDto[]
  females: number
  males: number
  unknownSex: number
  notes: string
  recordedBy: ReviewPersonDto
  createdAt: string
}

export interface TranslocationListResponse { items: TranslocationDto[] }

export interface ObservationDto {
  id: number
  proposalId: number
  subpopulationId: number
  observedOn: string
  census: number | null
  heterozygosity: number | null
  inbreeding: number | null
  source: string
  notes: string
  recordedBy: ReviewPersonDto
  createdAt: string
}

/** GET /api/proposals/:id/monitoring */
export interface MonitoringResponse {
  proposalId: number
  proposalStatus: ProposalStatus
  status: MonitoringStatus
  recipient: { id: number, name: string }
  /** The proposal's wild sources and its captive source in words (the translocation form's choices). */
  sources: { id: number, name: string }[]
  captiveSource: string | null
  translocations: TranslocationDto[]
  observations: ObservationDto[]
  /** Census counts of the recipient's record from the year of the first move on (or the decision year). */
  recordCensus: { year: number, adults: number }[]
  /** Observed against projected; null until the proposal is approved or when the figures are missing. */
  projection: MonitoringProjection | null
  /** Why there is no projection, when there is none. */
  projectionNote: string | null
  /** Whether the caller may record translocations and observations. */
  canRecord: boolean
}

/** Roles that record what was done after approval. */
export const MONITORING_RECORDERS = ['biologist', 'manager', 'administrator'] as const satisfies readonly Role[]
