/**
 * The review workflow as data: which action moves a proposal from which status to which, who may
 * take it, and why not when they may not. One table read by the server (server/utils/review-access.ts
 * enforces it on every workflow route) and by the interface (which buttons a person sees) — the
 * interface only hides, the server decides.
 *
 *   draft ──submit──▶ submitted ──approve──▶ approved  (frozen; "revise" starts a new linked draft)
 *     ▲                  │ │ └──decline──▶ declined
 *     │                  │ └─────return──▶ returned ──submit──▶ submitted (edited like a draft first)
 *     │                  └─withdraw─▶ withdrawn        returned ──withdraw──▶ withdrawn
 *
 * Rules (PRODUCT.md "Review and approval"):
 *   - the author submits (a biologist, or a manager / administrator acting as author); viewers never;
 *   - managers and administrators decide — approve, return or decline, always with a comment —
 *     but never on a proposal they wrote (separation of duties); when a reviewer is assigned, only
 *     that reviewer or an administrator decides;
 *   - the author withdraws a submitted (or returned) proposal;
 *   - administrators assign or reassign the reviewer while the proposal is open;
 *   - an approved, declined or withdrawn proposal is closed; a biologist, manager or
 *     administrator may start a revision of it (a new draft linked by `revises_id`).
 * Comments are not a transition: every role of the agency may comment at any status.
 */
import type { DecisionKind, ProposalStatus, Role } from '../types/db'

/** Everything the workflow lets someone do to a proposal. */
export const REVIEW_ACTIONS = ['submit', 'approve', 'return', 'decline', 'withdraw', 'reassign', 'revise'] as const
export type ReviewAction = typeof REVIEW_ACTIONS[number]

/** Who, relative to the proposal, may take an action. */
type Actor = 'author' | 'not-author' | 'anyone'

/** One row of the table. */
export interface ReviewTransition {
  /** Statuses the action starts from. */
  from: readonly ProposalStatus[]
  /** Status afterwards; null when the proposal itself keeps its status (reassign, revise). */
  to: ProposalStatus | null
  /** Roles that may take it at all. */
  roles: readonly Role[]
  actor: Actor
  /** Whether the action needs a written reason. */
  commentRequired: boolean
  /** Words for buttons and the timeline. */
  label: string
}

const DECIDERS = ['manager', 'administrator'] as const satisfies readonly Role[]
const WRITERS = ['biologist', 'manager', 'administrator'] as const satisfies readonly Role[]

/** The workflow table. */
export const REVIEW_TRANSITIONS: Readonly<Record<ReviewAction, ReviewTransition>> = {
  submit: { from: ['draft', 'returned'], to: 'submitted', roles: WRITERS, actor: 'author', commentRequired: false, label: 'Submit for review' },
  approve: { from: ['submitted'], to: 'approved', roles: DECIDERS, actor: 'not-author', commentRequired: true, label: 'Approve' },
  return: { from: ['submitted'], to: 'returned', roles: DECIDERS, actor: 'not-author', commentRequired: true, label: 'Return for changes' },
  decline: { from: ['submitted'], to: 'declined', roles: DECIDERS, actor: 'not-author', commentRequired: true, label: 'Decline' },
  withdraw: { from: ['submitted', 'returned'], to: 'withdrawn', roles: WRITERS, actor: 'author', commentRequired: false, label: 'Withdraw' },
  reassign: { from: ['draft', 'submitted', 'returned'], to: null, roles: ['administrator'], actor: 'anyone', commentRequired: false, label: 'Assign reviewer' },
  revise: { from: ['approved', 'declined', 'withdrawn'], to: null, roles: WRITERS, actor: 'anyone', commentRequired: false, label: 'Start a revision' },
}

/** The decision kinds and the action each one is. */
export const DECISION_ACTIONS: Readonly<Record<DecisionKind, ReviewAction>> = { approve: 'approve', return: 'return', decline: 'decline' }

/** Statuses after which nothing but a revision can follow. */
export const CLOSED_STATUSES = ['approved', 'declined', 'withdrawn'] as const satisfies readonly ProposalStatus[]

/** What the check needs to know about the proposal and the person. */
export interface ReviewContext {
  status: ProposalStatus
  role: Role
  /** The person is the proposal's author. */
  isAuthor: boolean
  /** Id of the assigned reviewer, null when any manager may decide. */
  reviewerId: number | null
  /** The person's id (compared with reviewerId). */
  userId: number
  /** Name of the assigned reviewer, for the refusal message. */
  reviewerName?: string | null
}

/** The verdict: allowed (with the status afterwards), or refused with an HTTP status and a reason. */
export type ReviewVerdict
  = | { allowed: true, to: ProposalStatus | null }
    | { allowed: false, status: 403 | 409, reason: string }

const STATUS_WORDS: Record<ProposalStatus, string> = {
  draft: 'a draft',
  submitted: 'submitted and waiting for a decision',
  approved: 'approved',
  returned: 'returned to its author',
  declined: 'declined',
  withdrawn: 'withdrawn',
}

/** "is a draft", "was approved" … for messages. */
export function statusPhrase(status: ProposalStatus): string {
  return status === 'draft' || status === 'submitted' ? `is ${STATUS_WORDS[status]}` : `was ${STATUS_WORDS[status]}`
}

const ROLE_WORDS: Record<ReviewAction, string> = {
  submit: 'Only biologists, managers and administrators submit proposals.',
  approve: 'Only managers and administrators decide on proposals.',
  return: 'Only managers and administrators decide on proposals.',
  decline: 'Only managers and administrators decide on proposals.',
  withdraw: 'Only biologists, managers and administrators withdraw proposals.',
  reassign: 'Only administrators assign reviewers.',
  revise: 'Only biologists, managers and administrators start revisions.',
}

function statusRefusal(action: ReviewAction, status: ProposalStatus): string {
  const now = `This proposal ${statusPhrase(status)}`
  switch (action) {
    case 'submit': return status === 'submitted'
      ? `${now}; it was already submitted.`
      : `${now}, so it cannot be submitted; only drafts and returned proposals can.`
    case 'approve':
    case 'return':
    case 'decline': return status === 'draft' || status === 'returned'
      ? `${now}; it can be decided once its author submits it.`
      : `${now}; a decision was already recorded, so yours was not. Reload to see it.`
    case 'withdraw': return `${now}; only a submitted or returned proposal can be withdrawn.`
    case 'reassign': return `${now}; a reviewer can only be assigned while the proposal is open (draft, submitted or returned).`
    case 'revise': return `${now}; only approved, declined or withdrawn proposals are revised — edit this one directly.`
  }
}

/**
 * May this person take this action on this proposal now?
 *
 * Checks in order: the role (403), who they are to the proposal — author or not, the assigned
 * reviewer (403) — then the status (409: the proposal moved on, e.g. another manager decided
 * first).
 *
 * @param action - the workflow action
 * @param context - the proposal's status and reviewer, the person's role and id, authorship
 * @returns `{ allowed: true, to }` or `{ allowed: false, status, reason }`
 * @example reviewVerdict('approve', { status: 'submitted', role: 'manager', isAuthor: true, reviewerId: null, userId: 2 })
 *   // { allowed: false, status: 403, reason: 'You wrote this proposal, so you cannot decide on it: …' }
 * @example reviewVerdict('submit', { status: 'draft', role: 'biologist', isAuthor: true, reviewerId: null, userId: 3 })
 *   // { allowed: true, to: 'submitted' }
 */
export function reviewVerdict(action: ReviewAction, context: ReviewContext): ReviewVerdict {
  const rule = REVIEW_TRANSITIONS[action]
  if (!rule.roles.includes(context.role)) return { allowed: false, status: 403, reason: `${ROLE_WORDS[action]} Your role is ${context.role}.` }
  if (rule.actor === 'author' && !context.isAuthor) {
    return { allowed: false, status: 403, reason: action === 'submit'
      ? 'Only the author of this proposal can submit it.'
      : 'Only the author of this proposal can withdraw it.' }
  }
  if (rule.actor === 'not-author') {
    if (context.isAuthor) {
      return { allowed: false, status: 403, reason: 'You wrote this proposal, so you cannot decide on it: another manager must review it (separation of duties).' }
    }
    if (context.reviewerId !== null && context.reviewerId !== context.userId && context.role !== 'administrator') {
      const who = context.reviewerName ? context.reviewerName : 'another reviewer'
      return { allowed: false, status: 403, reason: `This proposal is assigned to ${who} for review. An administrator can reassign it to you.` }
    }
  }
  if (!rule.from.includes(context.status)) return { allowed: false, status: 409, reason: statusRefusal(action, context.status) }
  return { allowed: true, to: rule.to }
}

/**
 * The actions this person may take now (for the buttons a page shows).
 *
 * @example allowedReviewActions({ status: 'submitted', role: 'manager', isAuthor: false, reviewerId: null, userId: 2 })
 *   // ['approve', 'return', 'decline']
 */
export function allowedReviewActions(context: ReviewContext): ReviewAction[] {
  return REVIEW_ACTIONS.filter(action => reviewVerdict(action, context).allowed)
}

/** Whether a submitted proposal waits for this person's decision (inbox "waiting for me"). */
export function waitsFor(context: ReviewContext): boolean {
  return context.status === 'submitted' && reviewVerdict('approve', context).allowed
}
