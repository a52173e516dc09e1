import { requireNonNegative, requirePositive } from '../validate'

/**
 * Converts a time span in years to generations.
 *
 * Why: every recurrence in the engine runs per generation, while managers
 * plan in years; a 20-year plan is 10 generations at L = 2 but 2.5 at L = 8
 * (SCIENCE.md §10).
 *
 * Formula: generations = years / L, where L is the generation length (mean
 * age of parents when offspring are born, not age at first breeding).
 * Assumptions: constant L; the result is real (inbreeding without migration
 * accepts fractional generations; with migration round to whole generations).
 * Reference: SCIENCE.md §10 (standard definition of generation length).
 *
 * @param years - time span, years, finite ≥ 0
 * @param generationTime - L, years per generation, finite > 0
 * @returns generations, ≥ 0
 * @throws RangeError if an argument is outside its domain
 * @example generationsFromYears({ years: 400, generationTime: 2 })  // 200
 * @example generationsFromYears({ years: 20, generationTime: 8 })   // 2.5
 * @example generationsFromYears({ years: 0, generationTime: 8 })    // 0
 */
export function generationsFromYears({ years, generationTime }: { years: number, generationTime: number }): number {
  requireNonNegative('generationsFromYears', 'years', years)
  requirePositive('generationsFromYears', 'generationTime', generationTime)
  return years / generationTime
}

/**
 * Converts a number of generations to years (inverse of `generationsFromYears`).
 *
 * Formula: years = generations × L (SCIENCE.md §10: 4Ne generations with
 * Ne = 50 is 200 generations = 400 years at L = 2 and 1600 years at L = 8).
 * Assumptions: constant generation length L.
 *
 * @param generations - generations, finite ≥ 0
 * @param generationTime - L, years per generation, finite > 0
 * @returns years, ≥ 0
 * @throws RangeError if an argument is outside its domain
 * @example yearsFromGenerations({ generations: 200, generationTime: 8 })  // 1600
 * @example yearsFromGenerations({ generations: 0, generationTime: 2 })    // 0
 */
export function yearsFromGenerations({ generations, generationTime }: { generations: number, generationTime: number }): number {
  requireNonNegative('yearsFromGenerations', 'generations', generations)
  requirePositive('yearsFromGenerations', 'generationTime', generationTime)
  return generations * generationTime
}
