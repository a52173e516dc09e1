/**
 * The workflow table (shared/review/workflow.ts) applied to a proposal row and the caller:
 *
 *   const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })  // 404 other agency
 *   const to = await requireReviewAction('approve', proposal, user, t)                  // 403 / 409
 *
 * The row lock (SELECT … FOR UPDATE) serialises concurrent workflow actions on one proposal:
 * the second of two managers deciding at once waits for the first to commit, then finds the
 * status moved on and gets 409.
 */
import type { Transaction } from 'sequelize'
import type { Proposal } from '../db/models'
import { reviewVerdict, type ReviewAction, type ReviewContext } from '#shared/review/workflow'
import type { ProposalStatus } from '#shared/types/db'
import type { CurrentUser } from './auth'

/** The workflow context of `user` on `proposal` (the reviewer's name only for messages). */
export function reviewContextFor(proposal: Proposal, user: Pick<CurrentUser, 'id' | 'role'>, reviewerName: string | null = null): ReviewContext {
  return {
    status: proposal.status,
    role: user.role,
    isAuthor: proposal.authorId === user.id,
    reviewerId: proposal.reviewerId ?? null,
    userId: user.id,
    reviewerName,
  }
}

/** The assigned reviewer's name (null when none is assigned). */
export async function assignedReviewerName(proposal: Proposal, transaction?: Transaction): Promise<string | null> {
  if (proposal.reviewerId === null || proposal.reviewerId === undefined) return null
  const { models } = await useDb()
  const reviewer = await models.User.findByPk(proposal.reviewerId, { attributes: ['id', 'name'], transaction })
  return reviewer?.name ?? null
}

/**
 * Throws 403 or 409 (with the workflow's reason) unless `user` may take `action` on `proposal`
 * now; returns the status the proposal moves to (null when it keeps its status).
 */
export async function requireReviewAction(action: ReviewAction, proposal: Proposal, user: Pick<CurrentUser, 'id' | 'role'>, transaction?: Transaction): Promise<ProposalStatus | null> {
  const verdict = reviewVerdict(action, reviewContextFor(proposal, user, await assignedReviewerName(proposal, transaction)))
  if (verdict.allowed) return verdict.to
  throw verdict.status === 403 ? forbidden(verdict.reason) : conflict(verdict.reason)
}

/**
 * 409 when the caller sent a `version` and the proposal has moved on since (someone acted on
 * it after the caller loaded it). Workflow actions may leave the version out; the status check
 * then decides.
 */
export function requireReviewVersion(proposal: Proposal, version: number | undefined): void {
  if (version === undefined || proposal.version === version) return
  throw conflict(`This proposal changed after you opened it (it ${proposal.status === 'draft' ? 'is a draft' : `is now ${proposal.status}`}). Reload it to see the current state, then try again.`)
}
