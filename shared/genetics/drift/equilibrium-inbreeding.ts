import { requireInRange } from '../validate'
import { requireEffectiveSize } from './effective-size-domain'
import { islandModelSolution } from './island-model-solution'

/**
 * Equilibrium inbreeding (F̂, the neutral F_ST of the island model) that a
 * subpopulation approaches under a constant rate of immigration.
 *
 * Why: the long-run level that a regular gene-flow schedule holds F at; used
 * to size a schedule ("how much gene flow keeps F below 0.1?").
 *
 * Formula (SCIENCE.md §4.2, fixed point of eq. 4.2):
 *     F̂ = (1 − m)² / [2Ne − (2Ne − 1)(1 − m)²],
 * evaluated as (1 − m)² / [2Ne·m·(2 − m) + (1 − m)²] (the same expression with
 * the denominator expanded) so that small m and large Ne do not cancel.
 * For small m and large Ne, F̂ ≈ 1/(4·Ne·m + 1) — see
 * `equilibriumInbreedingApproximation`.
 * Assumptions: Wright's island model: constant Ne and m, immigrants from a
 * large unrelated source, neutral loci. It says nothing about how fast F gets
 * there (rate ≈ 2m + 1/(2Ne) per generation; use `inbreedingTrajectory`).
 * Reference: Wright, S. (1931). Evolution in Mendelian populations.
 *   Genetics 16: 97–159.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param migrationRate - m, fraction of genes per generation from immigrants, in [0, 1]
 * @returns F̂, in [0, 1]; 1 when m = 0 (isolation ends in complete inbreeding), 0 when m = 1
 * @throws RangeError if an argument is outside its domain
 * @example equilibriumInbreeding({ effectiveSize: 50, migrationRate: 0.02 })  // 0.19518738313958214
 * @example equilibriumInbreeding({ effectiveSize: 20, migrationRate: 0.1 })   // 0.09631391200951249
 * @example equilibriumInbreeding({ effectiveSize: 50, migrationRate: 0 })     // 1
 * @example equilibriumInbreeding({ effectiveSize: 50, migrationRate: 1 })     // 0
 */
export function equilibriumInbreeding({ effectiveSize, migrationRate }: {
  effectiveSize: number
  migrationRate: number
}): number {
  const fn = 'equilibriumInbreeding'
  requireEffectiveSize(fn, 'effectiveSize', effectiveSize)
  requireInRange(fn, 'migrationRate', migrationRate, 0, 1)
  return islandModelSolution(effectiveSize, migrationRate).equilibrium
}
