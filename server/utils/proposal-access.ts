/**
 * Who may touch a proposal, and when:
 *   - PROPOSAL_WRITERS (biologist, manager, administrator) create and edit; viewers read only;
 *   - a proposal of another agency, or one that does not exist, answers 404 (never 403);
 *   - only 'draft' and 'returned' proposals are editable (their scenarios too); otherwise 409
 *     with the reason (approved ones are frozen: start a revision);
 *   - an edit based on an old `version` answers 409 naming who saved last and when.
 */
import type { Transaction } from 'sequelize'
import type { Proposal } from '../db/models'
import type { ProposalStatus } from '#shared/types/db'
import { proposalStatusEditable } from './proposal-dto'
import { staleProposalMessage } from './proposal-versions'

/** Roles that may create and edit proposals and scenarios. */
export const PROPOSAL_WRITERS = ['biologist', 'manager', 'administrator'] as const

/**
 * Proposal `id` of the caller's agency.
 *
 * @param user - the caller (only agencyId is read)
 * @param id - proposal id from the route
 * @param options.transaction - read inside this transaction
 * @param options.lock - take a row lock (FOR UPDATE), to serialise writers
 * @throws 404 "Proposal not found." for an unknown id or another agency's proposal
 */
export async function findAgencyProposal(user: { agencyId: number }, id: number, options: { transaction?: Transaction, lock?: boolean } = {}): Promise<Proposal> {
  const { models } = await useDb()
  const proposal = await models.Proposal.findOne({
    where: { id, agencyId: user.agencyId },
    transaction: options.transaction,
    lock: options.lock && options.transaction ? options.transaction.LOCK.UPDATE : undefined,
  })
  if (!proposal) throw notFound('Proposal')
  return proposal
}

const NOT_EDITABLE: Record<ProposalStatus, string> = {
  draft: '',
  returned: '',
  submitted: 'This proposal is submitted and waiting for a decision; it cannot be changed now. Withdraw it to edit it again.',
  approved: 'This proposal is approved and frozen; start a revision to change it.',
  declined: 'This proposal was declined and is closed; start a new proposal or a revision to change it.',
  withdrawn: 'This proposal was withdrawn and is closed; start a new proposal or a revision to change it.',
}

/** The 409 message for changing a proposal in `status` ('' when it is editable). */
export function proposalNotEditableMessage(status: ProposalStatus): string {
  return proposalStatusEditable(status) ? '' : NOT_EDITABLE[status]
}

/** Throws 409 when the proposal's status does not allow edits (to it or its scenarios). */
export function requireEditableProposal(proposal: Proposal): void {
  const message = proposalNotEditableMessage(proposal.status)
  if (message) throw conflict(message)
}

/** Throws 409 (with who saved last and when) when `version` is not the proposal's current one. */
export async function requireCurrentProposalVersion(proposal: Proposal, version: number, caller: { id: number }, transaction?: Transaction): Promise<void> {
  if (proposal.version === version) return
  throw conflict(await staleProposalMessage(proposal, caller, transaction))
}
