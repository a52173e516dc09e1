/**
 * Odds of allele A among the gametes of the next generation after one round
 * of viability selection (SCIENCE.md §2.1, eq. 2.1), written without any
 * subtraction so that it keeps full relative precision for every input.
 *
 * Formula: with i copies of A among n = 2N genes (p = i/n, q = 1 − p) and
 * fitnesses w_AA = 1+s, w_Aa = 1+h·s, w_aa = 1, random union of gametes and
 * selection give p′ = p·(p·w_AA + q·w_Aa) / w̄ and q′ = q·(p·w_Aa + q·w_aa) / w̄,
 * so p′/q′ = i·(i·w_AA + (n−i)·w_Aa) / ((n−i)·(i·w_Aa + (n−i)·w_aa)).
 * Every term is a product or sum of positive numbers. Fitnesses are divided by
 * the largest one first, so huge 1+s cannot overflow.
 *
 * @returns `{ numerator, denominator }` with p′/q′ = numerator/denominator,
 *   both > 0 for 0 < i < n.
 */
export function selectedOdds(copies: number, geneCopies: number, s: number, h: number): { numerator: number, denominator: number } {
  const homozygote = 1 + s
  const heterozygote = 1 + h * s
  const largest = Math.max(homozygote, heterozygote, 1)
  const fitnessAA = homozygote / largest
  const fitnessAa = heterozygote / largest
  const fitnessaa = 1 / largest
  const others = geneCopies - copies
  return {
    numerator: copies * (copies * fitnessAA + others * fitnessAa),
    denominator: others * (copies * fitnessAa + others * fitnessaa),
  }
}
