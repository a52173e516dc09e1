/**
 * The version history of proposals (table proposal_versions, migration 0005): a snapshot row
 * per saved state, written inside the transaction of the change, and the "who saved last"
 * explanation of a stale edit.
 *
 *   await saveProposalVersion(t, proposal, user, changedFields)   // after proposal.save()
 */
import type { Transaction } from 'sequelize'
import type { Proposal, ProposalVersion } from '../db/models'
import type { ProposalPersonDto, ProposalVersionDto, ProposalVersionSummaryDto } from '#shared/schemas/proposal'
import { proposalDto } from './proposal-dto'

/**
 * Stores the proposal as it is now (after its save) as version `proposal.version`.
 *
 * @param transaction - the transaction of the change
 * @param proposal - the saved proposal
 * @param savedBy - who saved it (null for the system, e.g. a seed)
 * @param changedFields - top-level fields this save changed ([] for the first version)
 */
export async function saveProposalVersion(transaction: Transaction, proposal: Proposal, savedBy: { id: number } | null, changedFields: string[]): Promise<ProposalVersion> {
  const { models } = await useDb()
  return models.ProposalVersion.create({
    proposalId: proposal.id,
    version: proposal.version,
    snapshot: proposalDto(proposal) as unknown as Record<string, unknown>,
    changedFields,
    savedBy: savedBy?.id ?? null,
    savedAt: proposal.updatedAt ?? new Date(),
  }, { transaction })
}

/** The latest version row of a proposal with the saver's name (null when there is none). */
export async function latestProposalVersion(proposalId: number, transaction?: Transaction): Promise<ProposalVersion | null> {
  const { models } = await useDb()
  return models.ProposalVersion.findOne({
    where: { proposalId },
    include: [{ model: models.User, as: 'saver', attributes: ['id', 'name'] }],
    order: [['version', 'DESC'], ['id', 'DESC']],
    transaction,
  })
}

/** The person who saved a version row (null when unknown). */
function saverOf(row: ProposalVersion): ProposalPersonDto | null {
  return row.saver ? { id: row.saver.id, name: row.saver.name } : null
}

/** A version row for the history list. */
export function proposalVersionSummaryDto(row: ProposalVersion): ProposalVersionSummaryDto {
  return {
    version: row.version,
    savedBy: saverOf(row),
    savedAt: new Date(row.savedAt).toISOString(),
    changedFields: [...(row.changedFields ?? [])],
  }
}

/** A version row with its snapshot. */
export function proposalVersionDto(row: ProposalVersion): ProposalVersionDto {
  return { ...proposalVersionSummaryDto(row), snapshot: row.snapshot as unknown as ProposalVersionDto['snapshot'] }
}

/**
 * "2025-06-03 14:05 UTC" — a save time for a sentence.
 *
 * @example proposalSaveTimeWords(new Date('2025-06-03T14:05:09Z')) // '2025-06-03 14:05 UTC'
 */
export function proposalSaveTimeWords(date: Date): string {
  const text = new Date(date).toISOString()
  return `${text.slice(0, 10)} ${text.slice(11, 16)} UTC`
}

/**
 * The 409 message for an edit based on an old version, naming who saved last and when (from
 * the latest proposal_versions row; the proposal's own updated_at when there is none).
 *
 * @param proposal - the proposal as it is now
 * @param caller - the person whose edit is refused (named "you" when they saved last themselves)
 */
export async function staleProposalMessage(proposal: Proposal, caller: { id: number }, transaction?: Transaction): Promise<string> {
  const latest = await latestProposalVersion(proposal.id, transaction)
  const when = proposalSaveTimeWords(latest?.savedAt ?? proposal.updatedAt)
  const saver = latest?.saver
  if (saver && saver.id === caller.id) {
    return `This proposal was saved again after you opened it (by you, in another window or tab, ${when}). Reload to see that version; your edits are still in the form.`
  }
  return `Someone else saved this proposal after you opened it (${saver ? saver.name : 'name not recorded'}, ${when}). Reload to see their changes; your edits are still in the form.`
}
