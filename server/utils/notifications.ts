/**
 * Review e-mails. Each function queues its messages with `queueMail` INSIDE the caller's
 * transaction: a rolled-back action sends nothing, a committed one is never lost — the outbox
 * dispatcher (server/plugins/mail-dispatcher.ts) sends after commit and retries failures, so a
 * failing SMTP server never blocks or undoes a decision.
 *
 *   - on submit:            the agency's managers (other than the author), and the assigned reviewer;
 *   - on a decision:        the author;
 *   - on a mention:         each person mentioned (not the comment's author);
 *   - on a reviewer change: the newly assigned reviewer.
 * Only people who can sign in are written to (active, with a password).
 */
import { Op, type Transaction } from 'sequelize'
import type { Agency, Proposal, User } from '../db/models'
import type { DecisionKind } from '#shared/types/db'
import { appLink } from './mail-messages'

/** Who can receive review mail: active users of the agency who have set a password. */
function reachable(user: Pick<User, 'active' | 'passwordHash'> | null | undefined): boolean {
  return Boolean(user && user.active && user.passwordHash !== null)
}

async function agencyOf(agencyId: number, transaction: Transaction): Promise<Pick<Agency, 'name'>> {
  const { models } = await useDb()
  return (await models.Agency.findByPk(agencyId, { attributes: ['id', 'name'], transaction })) ?? { name: 'your agency' }
}

function signOff(agencyName: string): string {
  return `— Tributary, for ${agencyName}`
}

/** Shortens a text for an e-mail quote (whole words, "…" when cut). */
export function quoteForMail(text: string, limit = 600): string {
  const clean = text.trim()
  if (clean.length <= limit) return clean
  const cut = clean.slice(0, limit)
  return `${cut.slice(0, Math.max(cut.lastIndexOf(' '), limit - 40))} …`
}

const quoted = (text: string) => quoteForMail(text).split('\n').map(line => `> ${line}`).join('\n')

/** Queues "review requested" to the managers (not the author) and the assigned reviewer. Returns the addresses. */
export async function notifySubmitted(transaction: Transaction, input: { proposal: Proposal, author: Pick<User, 'id' | 'name'>, recipientName: string, resubmitted: boolean }): Promise<string[]> {
  const { models } = await useDb()
  const { proposal } = input
  const managers = await models.User.findAll({
    where: {
      agencyId: proposal.agencyId,
      [Op.or]: [{ role: 'manager' }, ...(proposal.reviewerId ? [{ id: proposal.reviewerId }] : [])],
      id: { [Op.ne]: input.author.id },
      active: true,
      passwordHash: { [Op.ne]: null },
    },
    order: [['id', 'ASC']],
    transaction,
  })
  const agency = await agencyOf(proposal.agencyId, transaction)
  const link = appLink(`/reviews/${proposal.id}`)
  const sent: string[] = []
  for (const manager of managers.filter(reachable)) {
    const assigned = manager.id === proposal.reviewerId
    const subject = `${input.resubmitted ? 'Resubmitted' : 'Review requested'}: ${proposal.title}`
    const text = [
      `Hello ${manager.name},`,
      '',
      `${input.author.name} ${input.resubmitted ? 'resubmitted' : 'submitted'} the proposal "${proposal.title}" (recipient: ${input.recipientName}) for a decision.`,
      assigned
        ? 'You are the assigned reviewer.'
        : proposal.reviewerId ? 'Another reviewer is assigned; this is for your information.' : 'Any manager other than the author may decide on it.',
      '',
      'Read it and approve, return or decline it here:',
      link,
      '',
      'Agency policy, permits and licensed practice govern any translocation; Tributary records the decision.',
      '',
      signOff(agency.name),
    ].join('\n')
    await queueMail(transaction, { agencyId: proposal.agencyId, to: manager.email, subject, text })
    sent.push(manager.email)
  }
  return sent
}

const DECISION_WORDS: Record<DecisionKind, { subject: string, sentence: string, next: string }> = {
  approve: { subject: 'Approved', sentence: 'approved', next: 'The proposal is now frozen. Record the translocations and follow-up monitoring on its page; to change it, start a revision.' },
  return: { subject: 'Returned for changes', sentence: 'returned for changes', next: 'You can edit it and submit it again.' },
  decline: { subject: 'Declined', sentence: 'declined', next: 'The proposal is closed. You can start a revision of it.' },
}

/** Queues the decision to the author. Returns the address (null when the author cannot receive mail). */
export async function notifyDecision(transaction: Transaction, input: { proposal: Proposal, decision: DecisionKind, comment: string, decider: Pick<User, 'name'> }): Promise<string | null> {
  const { models } = await useDb()
  const { proposal } = input
  const author = await models.User.findByPk(proposal.authorId, { transaction })
  if (!author || !reachable(author)) return null
  const agency = await agencyOf(proposal.agencyId, transaction)
  const words = DECISION_WORDS[input.decision]
  const text = [
    `Hello ${author.name},`,
    '',
    `${input.decider.name} ${words.sentence} your proposal "${proposal.title}", with this comment:`,
    '',
    quoted(input.comment),
    '',
    words.next,
    appLink(`/proposals/${proposal.id}`),
    '',
    signOff(agency.name),
  ].join('\n')
  await queueMail(transaction, { agencyId: proposal.agencyId, to: author.email, subject: `${words.subject}: ${proposal.title}`, text })
  return author.email
}

/** Queues "you were mentioned" to each mentioned person other than the comment's author. Returns the addresses. */
export async function notifyMentions(transaction: Transaction, input: { proposal: Proposal, commentId: number, body: string, commenter: Pick<User, 'id' | 'name'>, mentioned: readonly User[] }): Promise<string[]> {
  const { proposal } = input
  const people = input.mentioned.filter(person => person.id !== input.commenter.id && reachable(person))
  if (people.length === 0) return []
  const agency = await agencyOf(proposal.agencyId, transaction)
  const sent: string[] = []
  for (const person of people) {
    const text = [
      `Hello ${person.name},`,
      '',
      `${input.commenter.name} mentioned you in a comment on the proposal "${proposal.title}":`,
      '',
      quoted(input.body),
      '',
      'Read the discussion and reply here:',
      appLink(`/reviews/${proposal.id}`, {}) + `#comment-${input.commentId}`,
      '',
      signOff(agency.name),
    ].join('\n')
    await queueMail(transaction, { agencyId: proposal.agencyId, to: person.email, subject: `${input.commenter.name} mentioned you: ${proposal.title}`, text })
    sent.push(person.email)
  }
  return sent
}

/** Queues "you are the reviewer" to a newly assigned reviewer. */
export async function notifyReviewerAssigned(transaction: Transaction, input: { proposal: Proposal, reviewer: User, assignedBy: Pick<User, 'name'> }): Promise<string | null> {
  if (!reachable(input.reviewer)) return null
  const { proposal, reviewer } = input
  const agency = await agencyOf(proposal.agencyId, transaction)
  const waiting = proposal.status === 'submitted'
  const text = [
    `Hello ${reviewer.name},`,
    '',
    `${input.assignedBy.name} assigned you as the reviewer of the proposal "${proposal.title}".`,
    waiting ? 'It is submitted and waits for your decision:' : 'It is not submitted yet; you will be told when it is. It is here:',
    appLink(`/reviews/${proposal.id}`),
    '',
    signOff(agency.name),
  ].join('\n')
  await queueMail(transaction, { agencyId: proposal.agencyId, to: reviewer.email, subject: `You are the reviewer: ${proposal.title}`, text })
  return reviewer.email
}
