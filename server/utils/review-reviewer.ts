/**
 * Who may be a proposal's reviewer: an active manager or administrator of the proposal's agency
 * who has signed up (has a password) and did not write it.
 */
import { Op, type Transaction } from 'sequelize'
import type { Proposal, User } from '../db/models'

/**
 * The user `reviewerId` if they may review `proposal`.
 *
 * @throws 422 `{ issues: [{ path: 'reviewerId' }] }` naming why not (unknown here, wrong role, inactive, the author)
 */
export async function requireReviewerCandidate(proposal: Proposal, reviewerId: number, transaction?: Transaction): Promise<User> {
  const { models } = await useDb()
  const reviewer = await models.User.findOne({ where: { id: reviewerId, agencyId: proposal.agencyId }, transaction })
  const refuse = (message: string) => unprocessable(message, [{ path: 'reviewerId', message }])
  if (!reviewer) throw refuse('Choose a reviewer from your agency.')
  if (reviewer.id === proposal.authorId) throw refuse('The author cannot review their own proposal; choose another manager.')
  if (!['manager', 'administrator'].includes(reviewer.role)) throw refuse(`${reviewer.name} is a ${reviewer.role}; only managers and administrators review proposals.`)
  if (!reviewer.active || reviewer.passwordHash === null) throw refuse(`${reviewer.name} cannot sign in at the moment, so cannot review.`)
  return reviewer
}

/** Ids of the users in `ids` who belong to `agencyId` and are active (for mentions). */
export async function activeAgencyUsers(agencyId: number, where: { ids?: readonly number[], emails?: readonly string[] }, transaction?: Transaction): Promise<User[]> {
  const { models } = await useDb()
  const or: Record<string, unknown>[] = []
  if (where.ids?.length) or.push({ id: { [Op.in]: [...where.ids] } })
  if (where.emails?.length) or.push({ email: { [Op.in]: [...where.emails] } })
  if (or.length === 0) return []
  return models.User.findAll({ where: { agencyId, active: true, [Op.or]: or }, transaction })
}
