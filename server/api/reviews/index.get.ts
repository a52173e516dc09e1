/**
 * GET /api/reviews → 200 ReviewInboxResponse
 *
 * The Reviews inbox: the agency's submitted proposals, longest-waiting first (how long each has
 * waited, author, recipient, recommendation, reviewer), each marked when it waits for the
 * caller's decision; and the 20 latest decisions. Every role reads it (only managers and
 * administrators see items waiting for them).
 */
import type { ReviewInboxResponse } from '#shared/schemas/review'
import { reviewInbox } from '../../utils/review-inbox'

export default defineEventHandler(async (event): Promise<ReviewInboxResponse> => {
  const user = await requireUser(event)
  return reviewInbox(user)
})
