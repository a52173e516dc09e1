/**
 * The one place where an approval asks for the signed brief. Called by the decision route
 * inside the approval's transaction, after the decision row, the status change, the audit event
 * and the author's e-mail are written: the brief service (server/utils/brief-service.ts) builds
 * the brief from the records as they stand in that transaction, signs it, stores it, audits it
 * and queues it to the author — so the approval and its brief commit or roll back together (a
 * failure to issue it refuses the approval with a 500 and nothing half done).
 *
 * Approved proposals that have no brief (approved before signing was set up, or seeded) get it
 * on the first download (server/api/proposals/[id]/brief.pdf.get.ts).
 */
import type { Transaction } from 'sequelize'
import { issueSignedBrief } from './brief-service'

/** Issues the signed brief of a just-approved proposal, inside the approval's transaction. */
export async function issueBriefOnApproval(transaction: Transaction, proposalId: number, approverId: number): Promise<void> {
  await issueSignedBrief(transaction, proposalId, { actorId: approverId })
}
