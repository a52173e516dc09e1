/**
 * POST /api/proposals/:id/comments { body, mentions?: number[] } → 201 CommentDto
 *
 * Any role of the agency comments, at any status (viewers included). People mentioned —
 * `@their.address` in the body, or ids in `mentions` — get an e-mail (not the commenter). The
 * comment, its audit event and the e-mails are written in one transaction.
 *
 * 404 another agency's proposal; 422 an empty or too long comment, or a mentioned id that is
 * not an active person of the agency.
 */
import { CommentCreateSchema, type CommentDto } from '#shared/schemas/review'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { notifyMentions } from '../../../utils/notifications'
import { resolveMentions } from '../../../utils/review-comments'
import { commentDto, reviewPersonDto } from '../../../utils/review-dto'

export default defineEventHandler(async (event): Promise<CommentDto> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, CommentCreateSchema, { maxBytes: 64 * 1024 })
  const { sequelize, models } = await useDb()

  const dto = await sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t })
    const mentioned = await resolveMentions(user.agencyId, input.body, input.mentions ?? [], t)
    const comment = await models.Comment.create({
      proposalId: proposal.id, authorId: user.id, body: input.body, mentions: mentioned.map(person => person.id),
    }, { transaction: t })
    // The commenter is the signed-in user, whose name the user check has just read.
    const result: CommentDto = { ...commentDto(comment, new Map(mentioned.map(person => [person.id, reviewPersonDto(person)]))), author: reviewPersonDto(user) }
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'comment.create',
      entityType: 'comment', entityId: comment.id, before: null,
      after: { proposalId: proposal.id, body: comment.body, mentions: comment.mentions },
    })
    await notifyMentions(t, { proposal, commentId: comment.id, body: comment.body, commenter: user, mentioned })
    return result
  })
  setResponseStatus(event, 201)
  return dto
})
