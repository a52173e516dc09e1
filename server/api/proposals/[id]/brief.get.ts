/**
 * GET /api/proposals/:id/brief → 200 BriefStatusDto: whether the brief is issued (signed, with
 * its document ID and SHA-256) or a draft preview, and where to get the PDF. Any signed-in
 * member of the agency; another agency's proposal answers 404.
 */
import { ProposalIdParamsSchema } from '#shared/schemas/proposal'
import type { BriefStatusDto } from '#shared/schemas/brief'

export default defineEventHandler(async (event): Promise<BriefStatusDto> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, ProposalIdParamsSchema)
  const proposal = await findAgencyProposal(user, id)
  const { models } = await useDb()
  const agency = await models.Agency.findByPk(user.agencyId, { attributes: ['shortName'] })
  const issued = proposal.status === 'approved' ? await findIssuedBrief(id, user.agencyId) : null
  const approved = proposal.status === 'approved'
  return {
    proposalId: id,
    proposalStatus: proposal.status,
    state: approved ? 'issued' : 'draft',
    issued: issued
      ? { documentId: issued.documentId, sha256: issued.sha256, sizeBytes: issued.sizeBytes, signerSubject: issued.signerSubject, signedAt: new Date(issued.signedAt).toISOString() }
      : null,
    pdfUrl: `/api/proposals/${id}/brief.pdf`,
    downloadUrl: `/api/proposals/${id}/brief.pdf?download=1`,
    fileName: briefFileName(agency?.shortName ?? 'brief', id, !approved),
  }
})
