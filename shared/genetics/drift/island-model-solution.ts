import { logRetentionPerGeneration } from './effective-size-domain'

/**
 * Constants of the island-model inbreeding recurrence (SCIENCE.md eq. 4.2)
 *
 *     F_t = (1 − m)²·[ 1/(2Ne) + (1 − 1/(2Ne))·F_(t−1) ]
 *
 * written as F_t = a + b·F_(t−1) with b = (1 − m)²·(1 − 1/(2Ne)) and fixed
 * point F̂ = a / (1 − b). Internal to the drift folder.
 */
export interface IslandModelSolution {
  /** ln b, the log of the per-generation decay of (F − F̂); −Infinity when b = 0. */
  readonly logDecay: number
  /** F̂, the equilibrium inbreeding (1 when m = 0). */
  readonly equilibrium: number
}

/**
 * Builds the constants; assumes the arguments were validated.
 * F̂ is evaluated as (1 − m)² / [2Ne·m·(2 − m) + (1 − m)²], which is the
 * SCIENCE.md §4.2 form (1 − m)² / [2Ne − (2Ne − 1)(1 − m)²] with the
 * denominator expanded so that small m and large Ne do not cancel.
 */
export function islandModelSolution(effectiveSize: number, migrationRate: number): IslandModelSolution {
  const residentShare = (1 - migrationRate) * (1 - migrationRate)
  const logDecay = 2 * Math.log1p(-migrationRate) + logRetentionPerGeneration(effectiveSize)
  const equilibrium = residentShare / (2 * effectiveSize * migrationRate * (2 - migrationRate) + residentShare)
  return { logDecay, equilibrium }
}

/**
 * F after t generations from F_0: the exact solution of the linear recurrence,
 * F_t = F̂·(1 − bᵗ) + F_0·bᵗ. Both terms are non-negative and 1 − bᵗ comes
 * from expm1, so the result keeps full relative precision for any t (no
 * cancellation, no error growth with t). With m = 0 (F̂ = 1) it is exactly
 * Wright's 1 − F_t = (1 − F_0)(1 − 1/(2Ne))ᵗ (SCIENCE.md eq. 4.1).
 */
export function inbreedingAtGeneration(solution: IslandModelSolution, initialInbreeding: number, generations: number): number {
  // t = 0 first: 0 · ln(0) would be NaN when b = 0 (m = 1 or Ne = ½).
  if (generations === 0) return initialInbreeding
  const exponent = generations * solution.logDecay
  const remaining = Math.exp(exponent)
  const approached = -Math.expm1(exponent)
  // Rounding can push the sum a few ulps past 1; F is a probability.
  return Math.min(1, solution.equilibrium * approached + initialInbreeding * remaining)
}
