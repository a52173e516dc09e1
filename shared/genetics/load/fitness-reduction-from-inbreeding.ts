import { lethalEquivalentsPerGamete, requireInbreeding, requireLethalEquivalents } from './load-domain'

/**
 * Proportional loss of fitness caused by inbreeding (inbreeding depression),
 * 1 − W/W₀.
 *
 * Why: the form in which results are usually quoted ("a full-sib mating costs
 * about a third of juvenile survival"); computed directly so that small
 * losses keep full precision (SCIENCE.md §6.1 "reduction" column).
 *
 * Formula: 1 − exp(−B·F) with B = 2B/2, evaluated as −expm1(−B·F).
 * Assumptions: as for `relativeFitness` (Morton–Crow–Muller log-linear model,
 * no purging, same environment).
 * Reference: Morton, N. E., Crow, J. F., Muller, H. J. (1956). PNAS 42: 855–863.
 *
 * @param diploidLethalEquivalents - 2B, lethal equivalents per diploid individual, finite ≥ 0
 * @param inbreeding - F, in [0, 1]
 * @returns loss as a fraction of W₀, in [0, 1)
 * @throws RangeError if an argument is outside its domain
 * @example fitnessReductionFromInbreeding({ diploidLethalEquivalents: 3.1, inbreeding: 0.25 })  // 0.3212483657485856
 * @example fitnessReductionFromInbreeding({ diploidLethalEquivalents: 12, inbreeding: 0.25 })   // 0.7768698398515702
 * @example fitnessReductionFromInbreeding({ diploidLethalEquivalents: 6, inbreeding: 0 })       // 0
 */
export function fitnessReductionFromInbreeding({ diploidLethalEquivalents, inbreeding }: {
  diploidLethalEquivalents: number
  inbreeding: number
}): number {
  const fn = 'fitnessReductionFromInbreeding'
  requireLethalEquivalents(fn, diploidLethalEquivalents)
  requireInbreeding(fn, 'inbreeding', inbreeding)
  // −expm1(−0) is −0; adding 0 normalises it to +0.
  return -Math.expm1(-lethalEquivalentsPerGamete(diploidLethalEquivalents) * inbreeding) + 0
}
