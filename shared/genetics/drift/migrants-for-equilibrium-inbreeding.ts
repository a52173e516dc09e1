import { domainError } from '../validate'

/**
 * Effective migrants per generation (Ne·m) needed for a target equilibrium
 * inbreeding (neutral F_ST), by inverting F̂ ≈ 1/(4·Ne·m + 1).
 *
 * Why: answers "how much gene flow holds F near the target in the long run"
 * in the units of the one-migrant rule, independently of Ne.
 *
 * Formula: Ne·m = (1/F̂ − 1) / 4 (SCIENCE.md §4.2: 0.2 → 1, 0.1 → 2.25,
 * 0.05 → 4.75, 0.02 → 12.25).
 * Assumptions: the large-Ne, small-m approximation of the island model; for
 * a specific Ne use `migrationRateForEquilibriumInbreeding`, which inverts
 * the exact equilibrium. Equilibrium only: says nothing about how fast F falls.
 * Reference: Wright, S. (1931). Genetics 16: 97–159; Mills & Allendorf (1996).
 *
 * @param targetInbreeding - F̂ wanted at equilibrium, in (0, 1]
 * @returns effective migrants per generation, ≥ 0 (0 for a target of 1)
 * @throws RangeError if targetInbreeding is outside (0, 1]
 * @example migrantsForEquilibriumInbreeding({ targetInbreeding: 0.2 })  // 1
 * @example migrantsForEquilibriumInbreeding({ targetInbreeding: 0.1 })  // 2.25
 * @example migrantsForEquilibriumInbreeding({ targetInbreeding: 1 })    // 0
 */
export function migrantsForEquilibriumInbreeding({ targetInbreeding }: { targetInbreeding: number }): number {
  if (typeof targetInbreeding !== 'number' || !Number.isFinite(targetInbreeding) || targetInbreeding <= 0 || targetInbreeding > 1) {
    domainError('migrantsForEquilibriumInbreeding', 'targetInbreeding', 'in (0, 1]', targetInbreeding)
  }
  // (1 − F̂)/F̂ rather than 1/F̂ − 1: one rounding fewer near F̂ = 1.
  return (1 - targetInbreeding) / (4 * targetInbreeding)
}
