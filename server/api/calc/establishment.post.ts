/**
 * POST /api/calc/establishment { census, effectiveSize, s, h, copies }
 *                           or { census, effectiveSize, s, h, migrantsPerEvent, sourceFrequency }
 *   → 200 EstablishmentCalcResponse (shared/schemas/scenario.ts).
 *
 * The genetics engine on the server, for API users: diffusion, exact chain where Ne = census ≤
 * 2000, Haldane's 2hs beside it, branching survival, warnings. Any signed-in user (it reads and
 * writes no record). Answers are remembered per input (server/utils/establishment-calc-memo.ts).
 * Shape errors → 422 from the schema; values outside the engine's domain → 422 with the
 * engine's reason at the parameter.
 */
import { EstablishmentCalcSchema, type EstablishmentCalcResponse } from '#shared/schemas/scenario'
import { rememberedEstablishmentCalc } from '../../utils/establishment-calc-memo'
import { engineRangeErrorIssue } from '../../utils/proposal-calc'

export default defineEventHandler(async (event): Promise<EstablishmentCalcResponse> => {
  await requireUser(event)
  const input = await readBodyWith(event, EstablishmentCalcSchema, { maxBytes: 16 * 1024 })
  try {
    return rememberedEstablishmentCalc(input)
  } catch (error) {
    const issue = engineRangeErrorIssue(error)
    if (!issue) throw error
    throw unprocessable(`${issue.path}: ${issue.message}`, [issue])
  }
})
