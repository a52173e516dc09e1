/**
 * POST /api/calc/establishment's answers, remembered per input.
 *
 * `establishmentCalc` is a pure function of its input (no records, no clock, no randomness): the
 * same census, Ne, s, h and copies or release always give the same figures. Forms and API users
 * ask for the same few inputs again and again (every keystroke in a form, every refresh), so the
 * last CALC_MEMO_SIZE answers are kept, least recently used first out. Inputs the engine refuses
 * throw as before and are not remembered. Answers are frozen: nobody can change one in place.
 */
import { LRUCache } from 'lru-cache'
import { deepFreeze } from './deep-freeze'
import type { EstablishmentCalcResponse } from '#shared/schemas/scenario'
import { establishmentCalc, type EstablishmentCalcRequest } from './proposal-calc'

/** Most answers remembered per process (one is a few kB). */
export const CALC_MEMO_SIZE = 1024

const answers = new LRUCache<string, EstablishmentCalcResponse>({ max: CALC_MEMO_SIZE })

/** The input's key: every field, in a fixed order (absent fields as null). */
function keyOf(input: EstablishmentCalcRequest): string {
  return JSON.stringify([input.census, input.effectiveSize, input.s, input.h, input.copies ?? null, input.migrantsPerEvent ?? null, input.sourceFrequency ?? null])
}

/**
 * `establishmentCalc(input)`, computed once per distinct input per process.
 *
 * @throws RangeError from the engine, as `establishmentCalc` (not remembered)
 */
export function rememberedEstablishmentCalc(input: EstablishmentCalcRequest): EstablishmentCalcResponse {
  const key = keyOf(input)
  const known = answers.get(key)
  if (known) return known
  const answer = deepFreeze(establishmentCalc(input))
  answers.set(key, answer)
  return answer
}
