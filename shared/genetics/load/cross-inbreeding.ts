import { requireInRange } from '../validate'

/**
 * Expected inbreeding of the second generation (F2) from random mating among
 * the first-generation offspring of a 1:1 cross between two populations.
 *
 * Why: a cross's F1 is nearly non-inbred (F = f_AB), but its F2 regains part
 * of the parental inbreeding (part of the F1 heterosis is lost); the brief
 * should show both (SCIENCE.md §6.2).
 *
 * Formula: F(F2) = (f_AA + 2·f_AB + f_BB) / 4, where f_AA and f_BB are the
 * mean kinships within each parental population and f_AB the kinship between
 * them, all relative to a common base. F(F1) = f_AB.
 * Assumptions: equal contributions of the two populations, random mating
 * among F1, kinships measured against the same base population.
 * Reference: standard pedigree-kinship algebra (SCIENCE.md §6.2 check values).
 *
 * @param kinshipWithinFirst - f_AA, mean kinship within population A, in [0, 1]
 * @param kinshipWithinSecond - f_BB, mean kinship within population B, in [0, 1]
 * @param kinshipBetween - f_AB, mean kinship between A and B, in [0, 1]
 * @returns expected F of F2 offspring, in [0, 1]
 * @throws RangeError if an argument is outside its domain
 * @example secondGenerationCrossInbreeding({ kinshipWithinFirst: 0.3, kinshipWithinSecond: 0.1, kinshipBetween: 0 })     // 0.1
 * @example secondGenerationCrossInbreeding({ kinshipWithinFirst: 0.3, kinshipWithinSecond: 0.1, kinshipBetween: 0.02 })  // 0.10999999999999999
 */
export function secondGenerationCrossInbreeding({ kinshipWithinFirst, kinshipWithinSecond, kinshipBetween }: {
  kinshipWithinFirst: number
  kinshipWithinSecond: number
  kinshipBetween: number
}): number {
  const fn = 'secondGenerationCrossInbreeding'
  requireInRange(fn, 'kinshipWithinFirst', kinshipWithinFirst, 0, 1)
  requireInRange(fn, 'kinshipWithinSecond', kinshipWithinSecond, 0, 1)
  requireInRange(fn, 'kinshipBetween', kinshipBetween, 0, 1)
  return (kinshipWithinFirst + 2 * kinshipBetween + kinshipWithinSecond) / 4
}
