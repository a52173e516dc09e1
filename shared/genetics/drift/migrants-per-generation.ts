import { requireInRange } from '../validate'
import { requireEffectiveSize } from './effective-size-domain'

/**
 * The one-migrant-per-generation rule of thumb, as cited data for comparison
 * with a schedule's effective migrants per generation (SCIENCE.md §4.3).
 *
 * - minimum / maximum: Mills & Allendorf (1996) suggest at least 1 and at most
 *   10 effective migrants per generation as a general genetic rule of thumb
 *   [paper: abstract, as reported in SCIENCE.md §4.3].
 * - equilibriumInbreedingAtMinimum: Ne·m = 1 gives F̂ ≈ 1/(4·1 + 1) = 0.2 by
 *   the island-model approximation.
 * - Fluctuating populations need more: Vucetich & Waite (2000) found about 60%
 *   of 44 animal populations needed > 10 and about 25% needed > 20
 *   [paper: abstract]. Wang (2004) re-derives the rule for non-ideal
 *   populations [memory].
 * The counts are *effective* migrants (Ne·m), not animals moved: convert with
 * the population's Ne/N and the expected breeding success of translocated
 * animals.
 */
export const ONE_MIGRANT_PER_GENERATION_RULE = {
  minimumEffectiveMigrants: 1,
  maximumEffectiveMigrants: 10,
  equilibriumInbreedingAtMinimum: 0.2,
  source: 'Mills LS, Allendorf FW (1996) The one-migrant-per-generation rule in conservation and management. Conservation Biology 10:1509–1518 [abstract]',
  caution: 'Vucetich JA, Waite TA (2000) Animal Conservation 3:261–266 [abstract]: with fluctuating population size about 60% of 44 populations needed more than 10 migrants per generation and about 25% more than 20.',
} as const

/**
 * Effective number of immigrants per generation, Ne·m.
 *
 * Why: puts a gene-flow schedule on the scale of the one-migrant-per-
 * generation rule (compare with `ONE_MIGRANT_PER_GENERATION_RULE`:
 * at least 1, at most 10; Mills & Allendorf 1996; Wang 2004).
 *
 * Formula: Ne·m, where m is the fraction of breeding genes contributed by
 * immigrants each generation.
 * Assumptions: island model (SCIENCE.md §4.2–4.3); m counts genes that
 * actually enter the breeding pool, not animals released.
 * Reference: Mills, L. S., Allendorf, F. W. (1996). Conservation Biology 10:
 *   1509–1518.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param migrationRate - m, fraction of genes per generation from immigrants, in [0, 1]
 * @returns effective migrants per generation, ≥ 0
 * @throws RangeError if an argument is outside its domain
 * @example migrantsPerGeneration({ effectiveSize: 50, migrationRate: 0.02 })  // 1
 * @example migrantsPerGeneration({ effectiveSize: 500, migrationRate: 0.001 }) // 0.5
 * @example migrantsPerGeneration({ effectiveSize: 50, migrationRate: 0 })     // 0
 */
export function migrantsPerGeneration({ effectiveSize, migrationRate }: {
  effectiveSize: number
  migrationRate: number
}): number {
  const fn = 'migrantsPerGeneration'
  requireEffectiveSize(fn, 'effectiveSize', effectiveSize)
  requireInRange(fn, 'migrationRate', migrationRate, 0, 1)
  return effectiveSize * migrationRate
}
