import { domainError } from '../validate'

/**
 * Diploid lethal equivalents implied by an observed relative fitness at a
 * known inbreeding coefficient (the inverse of `relativeFitness`).
 *
 * Why: lets a user enter "inbred young survive 30% less at F = 0.25" instead
 * of a lethal-equivalent count, and checks quoted figures (SCIENCE.md §6.4:
 * a ≤ 10% loss at F = 0.0247512 corresponds to 2B ≈ 8.5).
 *
 * Formula: from W/W₀ = exp(−(2B/2)·F), 2B = −2·ln(W/W₀) / F.
 * Assumptions: as for `relativeFitness` (log-linear model, single F, same
 * environment). A single comparison, not a regression over several F values.
 * Reference: Morton, N. E., Crow, J. F., Muller, H. J. (1956). PNAS 42: 855–863.
 *
 * @param relativeFitness - W/W₀, fitness of inbred relative to non-inbred, in (0, 1]
 * @param inbreeding - F of the inbred group, in (0, 1]
 * @returns 2B, diploid lethal equivalents, ≥ 0
 * @throws RangeError if an argument is outside its domain
 * @example diploidLethalEquivalentsFromFitness({ relativeFitness: 0.9, inbreeding: 0.0247512468781 })  // 8.513552159753994
 * @example diploidLethalEquivalentsFromFitness({ relativeFitness: 1, inbreeding: 0.25 })               // 0
 */
export function diploidLethalEquivalentsFromFitness({ relativeFitness, inbreeding }: {
  relativeFitness: number
  inbreeding: number
}): number {
  const fn = 'diploidLethalEquivalentsFromFitness'
  if (typeof relativeFitness !== 'number' || !Number.isFinite(relativeFitness) || relativeFitness <= 0 || relativeFitness > 1) {
    domainError(fn, 'relativeFitness', 'in (0, 1]', relativeFitness)
  }
  if (typeof inbreeding !== 'number' || !Number.isFinite(inbreeding) || inbreeding <= 0 || inbreeding > 1) {
    domainError(fn, 'inbreeding', 'in (0, 1]', inbreeding)
  }
  // −0 at relativeFitness = 1; adding 0 normalises it to +0.
  return (-2 * Math.log(relativeFitness)) / inbreeding + 0
}
