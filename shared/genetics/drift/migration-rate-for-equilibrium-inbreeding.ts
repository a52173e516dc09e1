import { domainError } from '../validate'
import { requireEffectiveSize } from './effective-size-domain'

/**
 * Migration rate m at which the exact island-model equilibrium inbreeding
 * equals a target, for a given Ne (the inverse of `equilibriumInbreeding`).
 *
 * Why: turns a management target ("hold F near 0.1") into a gene-flow rate
 * without the small-m approximation, which matters for small Ne.
 *
 * Formula: solving F̂ = (1 − m)² / [2Ne − (2Ne − 1)(1 − m)²] (SCIENCE.md §4.2)
 * for m gives
 *     (1 − m)² = q = 2Ne·F̂ / (1 + (2Ne − 1)·F̂),
 *     m = 1 − √q = d / (1 + √q),  with d = 1 − q = (1 − F̂) / (1 + (2Ne − 1)·F̂).
 * q and d are each formed directly (never as 1 minus the other), so m is
 * accurate when it is small and 1 − m is accurate when m is close to 1.
 * Assumptions: as for `equilibriumInbreeding` (island model at equilibrium,
 * constant Ne and m, unrelated immigrants from a large source).
 * Reference: Wright, S. (1931). Evolution in Mendelian populations.
 *   Genetics 16: 97–159.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param targetInbreeding - F̂ wanted at equilibrium, in (0, 1]
 * @returns m, in [0, 1]; 0 for a target of 1
 * @throws RangeError if an argument is outside its domain
 * @example migrationRateForEquilibriumInbreeding({ effectiveSize: 50, targetInbreeding: 0.195187383139582 })  // 0.020000000000000014
 * @example migrationRateForEquilibriumInbreeding({ effectiveSize: 50, targetInbreeding: 1 })                  // 0
 */
export function migrationRateForEquilibriumInbreeding({ effectiveSize, targetInbreeding }: {
  effectiveSize: number
  targetInbreeding: number
}): number {
  const fn = 'migrationRateForEquilibriumInbreeding'
  requireEffectiveSize(fn, 'effectiveSize', effectiveSize)
  if (typeof targetInbreeding !== 'number' || !Number.isFinite(targetInbreeding) || targetInbreeding <= 0 || targetInbreeding > 1) {
    domainError(fn, 'targetInbreeding', 'in (0, 1]', targetInbreeding)
  }
  const denominator = 1 + (2 * effectiveSize - 1) * targetInbreeding
  const residentShare = (2 * effectiveSize * targetInbreeding) / denominator // q = (1 − m)²
  const immigrantShare = (1 - targetInbreeding) / denominator // d = 1 − q
  return immigrantShare / (1 + Math.sqrt(residentShare))
}
