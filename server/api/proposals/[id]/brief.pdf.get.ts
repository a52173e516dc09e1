/**
 * GET /api/proposals/:id/brief.pdf[?download=1] → application/pdf. Any signed-in member of the
 * proposal's agency (another agency's proposal answers 404).
 *
 * - Approved: the signed file exactly as issued (bytes from the register, unchanged), with its
 *   SHA-256 in the `X-Brief-Sha256` header. An approved proposal that has no issued brief yet
 *   (approved before signing was set up) gets it issued now, once, as on approval.
 * - Any other status: a preview built now, marked "Draft — not approved" on every page and
 *   unsigned.
 * `download=1` asks the browser to save the file instead of showing it.
 */
import { z } from 'zod'
import { ProposalIdParamsSchema } from '#shared/schemas/proposal'

const Query = z.object({ download: z.enum(['0', '1'], { error: 'download is 0 or 1.' }).optional() })

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, ProposalIdParamsSchema)
  const { download } = getQueryWith(event, Query)
  const proposal = await findAgencyProposal(user, id)
  const { sequelize, models } = await useDb()
  const agency = await models.Agency.findByPk(user.agencyId, { attributes: ['shortName'] })
  const approved = proposal.status === 'approved'

  let pdf: Buffer
  if (approved) {
    let issued = await findIssuedBrief(id, user.agencyId, { withPdf: true })
    if (!issued) {
      await sequelize.transaction(async (transaction) => {
        await models.Proposal.findByPk(id, { lock: transaction.LOCK.UPDATE, transaction })
        await issueSignedBrief(transaction, id)
      })
      issued = await findIssuedBrief(id, user.agencyId, { withPdf: true })
    }
    if (!issued) throw notFound('Brief')
    pdf = Buffer.from(issued.pdf)
    setResponseHeader(event, 'x-brief-sha256', issued.sha256)
    setResponseHeader(event, 'x-brief-document-id', issued.documentId)
  } else {
    pdf = (await renderDraftBrief(id, user.agencyId)).pdf
  }

  const fileName = briefFileName(agency?.shortName ?? 'brief', id, !approved)
  setResponseHeader(event, 'content-type', 'application/pdf')
  setResponseHeader(event, 'content-length', pdf.length)
  setResponseHeader(event, 'content-disposition', `${download === '1' ? 'attachment' : 'inline'}; filename="${fileName}"`)
  setResponseHeader(event, 'cache-control', 'private, no-store')
  setResponseHeader(event, 'x-content-type-options', 'nosniff')
  return pdf
})
