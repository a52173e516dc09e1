import { requireInRange } from '../validate'
import { requireEffectiveSize } from './effective-size-domain'

/**
 * The textbook approximation F̂ ≈ 1/(4·Ne·m + 1) to the island-model
 * equilibrium inbreeding (neutral F_ST).
 *
 * Why: it is the form behind the one-migrant-per-generation rule
 * (Ne·m = 1 → F̂ ≈ 0.2) and what users will recognise; show it next to the
 * exact `equilibriumInbreeding`, which it overstates slightly (SCIENCE.md §4.2:
 * Ne = 50, m = 0.02 gives 0.2 against the exact 0.19519).
 *
 * Formula: F̂ ≈ 1 / (4·Ne·m + 1).
 * Assumptions: island model at equilibrium; accurate only for small m and
 * large Ne (terms in m² and m/Ne are dropped); neutral loci.
 * Reference: Wright, S. (1931). Evolution in Mendelian populations.
 *   Genetics 16: 97–159.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param migrationRate - m, fraction of genes per generation from immigrants, in [0, 1]
 * @returns approximate F̂, in (0, 1]; 1 when m = 0
 * @throws RangeError if an argument is outside its domain
 * @example equilibriumInbreedingApproximation({ effectiveSize: 50, migrationRate: 0.02 })   // 0.2
 * @example equilibriumInbreedingApproximation({ effectiveSize: 100, migrationRate: 0.005 }) // 0.3333333333333333
 * @example equilibriumInbreedingApproximation({ effectiveSize: 50, migrationRate: 0 })      // 1
 */
export function equilibriumInbreedingApproximation({ effectiveSize, migrationRate }: {
  effectiveSize: number
  migrationRate: number
}): number {
  const fn = 'equilibriumInbreedingApproximation'
  requireEffectiveSize(fn, 'effectiveSize', effectiveSize)
  requireInRange(fn, 'migrationRate', migrationRate, 0, 1)
  return 1 / (4 * effectiveSize * migrationRate + 1)
}
