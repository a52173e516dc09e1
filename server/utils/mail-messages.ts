/**
 * The words of the account e-mails (plain text, our own wording), kept apart from the sending
 * machinery in mail.ts. Each returns `{ subject, text }` for `queueMail`.
 */
import type { Transaction } from 'sequelize'
import type { User } from '../db/models'

/** An absolute link into the app: runtimeConfig.appUrl + path + query. */
export function appLink(path: string, query: Record<string, string> = {}): string {
  const base = String(useRuntimeConfig().appUrl || 'http://localhost:3000').replace(/\/+$/, '')
  const search = new URLSearchParams(query).toString()
  return `${base}${path}${search ? `?${search}` : ''}`
}

const ROLE_WORDS: Record<string, string> = {
  administrator: 'an administrator (users, agency profile, Outbox and everything else)',
  manager: 'a manager (reviews and decides on proposals)',
  biologist: 'a biologist (keeps records and drafts proposals)',
  viewer: 'a viewer (reads and comments)',
}

function formatWhen(date: Date): string {
  return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`
}

/**
 * Invitation to join an agency's workspace.
 *
 * @example inviteMail({ agencyName: 'Eastern Uplands Wildlife Service', inviterName: 'Ada', name: 'Ben', role: 'viewer', link: 'http://x/accept-invite?token=t', expiresAt: new Date(0) }).subject
 * // 'Ada invited you to Tributary (Eastern Uplands Wildlife Service)'
 */
export function inviteMail(input: { agencyName: string, inviterName: string, name: string, role: string, link: string, expiresAt: Date }) {
  const subject = `${input.inviterName} invited you to Tributary (${input.agencyName})`
  const text = [
    `Hello ${input.name},`,
    '',
    `${input.inviterName} has added you to the ${input.agencyName} workspace in Tributary, where the agency plans and reviews genetic rescue for small, isolated subpopulations.`,
    `You will join as ${ROLE_WORDS[input.role] ?? input.role}.`,
    '',
    'To accept, open this link and choose a password:',
    input.link,
    '',
    `The link works once and until ${formatWhen(input.expiresAt)}. If it has expired, ask ${input.inviterName} to send a new invitation.`,
    '',
    'If you did not expect this invitation, you can ignore this message; no account is active until the link is used.',
    '',
    `— Tributary, for ${input.agencyName}`,
  ].join('\n')
  return { subject, text }
}

/** Link to choose a new password after "Forgot password". */
export function passwordResetMail(input: { agencyName: string, name: string, link: string, expiresAt: Date }) {
  const subject = `Reset your Tributary password (${input.agencyName})`
  const text = [
    `Hello ${input.name},`,
    '',
    'Someone (we hope you) asked to reset the password of your Tributary account.',
    'To choose a new password, open this link:',
    input.link,
    '',
    `The link works once and until ${formatWhen(input.expiresAt)}. Choosing a new password signs you out on every other device.`,
    '',
    'If you did not ask for this, ignore this message: your password stays as it is.',
    '',
    `— Tributary, for ${input.agencyName}`,
  ].join('\n')
  return { subject, text }
}

/**
 * Issues a fresh 7-day invitation token for `user` (earlier ones stop working) and queues the
 * invitation e-mail with the link `${appUrl}/accept-invite?token=…`, inside `transaction`.
 */
export async function sendInvitation(transaction: Transaction, input: { user: User, inviterName: string, now?: Date }): Promise<void> {
  const { models } = await useDb()
  const now = input.now ?? new Date()
  const agency = await models.Agency.findByPk(input.user.agencyId, { transaction })
  const token = await issueUserToken(transaction, input.user.id, 'invite', INVITE_TOKEN_TTL_MS, now)
  const mail = inviteMail({
    agencyName: agency?.name ?? 'your agency',
    inviterName: input.inviterName,
    name: input.user.name,
    role: input.user.role,
    link: appLink('/accept-invite', { token }),
    expiresAt: new Date(now.getTime() + INVITE_TOKEN_TTL_MS),
  })
  await queueMail(transaction, { agencyId: input.user.agencyId, to: input.user.email, ...mail })
}
