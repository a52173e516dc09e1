/**
 * Comments on a proposal and the people they mention. A mention is `@email` written in the body
 * or a user id sent in `mentions`; both must name an active person of the proposal's agency.
 * A written `@address` that matches nobody is left as text; an id that matches nobody is an
 * input error (422), because a form sent it on purpose.
 */
import { Op, type Transaction } from 'sequelize'
import type { Comment, Proposal, User } from '../db/models'
import { mentionedEmails, type CommentDto, type ReviewPersonDto } from '#shared/schemas/review'
import { commentDto, reviewPersonDto } from './review-dto'
import { activeAgencyUsers } from './review-reviewer'

/**
 * The people a new comment mentions, in the order first mentioned.
 *
 * @throws 422 when an id in `ids` is not an active person of the agency
 */
export async function resolveMentions(agencyId: number, body: string, ids: readonly number[], transaction?: Transaction): Promise<User[]> {
  const emails = mentionedEmails(body)
  const found = await activeAgencyUsers(agencyId, { ids, emails }, transaction)
  const byId = new Map(found.map(user => [user.id, user]))
  const byEmail = new Map(found.map(user => [user.email.toLowerCase(), user]))
  const issues = ids.flatMap((id, index) => (byId.has(id) ? [] : [{ path: `mentions.${index}`, message: 'Mention someone of your agency who can sign in.' }]))
  if (issues.length > 0) throw unprocessable(issues[0]?.message ?? 'Check the mentions.', issues)
  const ordered: User[] = []
  const add = (user: User | undefined) => {
    if (user && !ordered.some(other => other.id === user.id)) ordered.push(user)
  }
  for (const email of emails) add(byEmail.get(email))
  for (const id of ids) add(byId.get(id))
  return ordered
}

/** Names of the users with the given ids (for mention lists). */
export async function peopleByIds(ids: Iterable<number>, transaction?: Transaction): Promise<Map<number, ReviewPersonDto>> {
  const unique = [...new Set(ids)].filter(id => Number.isInteger(id) && id > 0)
  if (unique.length === 0) return new Map()
  const { models } = await useDb()
  const rows = await models.User.findAll({ where: { id: { [Op.in]: unique } }, attributes: ['id', 'name'], transaction })
  return new Map(rows.map(row => [row.id, reviewPersonDto(row)]))
}

/** A proposal's comments, oldest first, with authors and mentions named. */
export async function proposalComments(proposal: Proposal, transaction?: Transaction): Promise<CommentDto[]> {
  const { models } = await useDb()
  const rows = await models.Comment.findAll({
    where: { proposalId: proposal.id },
    include: [{ model: models.User, as: 'author', attributes: ['id', 'name'] }],
    order: [['createdAt', 'ASC'], ['id', 'ASC']],
    transaction,
  })
  const people = await peopleByIds(rows.flatMap(row => mentionIdsOf(row)), transaction)
  return rows.map(row => commentDto(row, people))
}

/** The mentioned ids stored on a comment (numbers only). */
export function mentionIdsOf(comment: Comment): number[] {
  return (Array.isArray(comment.mentions) ? comment.mentions : []).map(Number).filter(id => Number.isInteger(id) && id > 0)
}

/** Active people of the agency who can sign in, by name (who a comment can mention). */
export async function mentionablePeople(agencyId: number, transaction?: Transaction): Promise<ReviewPersonDto[]> {
  const { models } = await useDb()
  const rows = await models.User.findAll({
    where: { agencyId, active: true, passwordHash: { [Op.ne]: null } },
    attributes: ['id', 'name'],
    order: [['name', 'ASC'], ['id', 'ASC']],
    transaction,
  })
  return rows.map(row => reviewPersonDto(row))
}
