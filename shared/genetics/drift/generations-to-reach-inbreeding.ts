import { domainError, requireInRange } from '../validate'
import { logRetentionPerGeneration, requireEffectiveSize } from './effective-size-domain'

/**
 * Generations until expected inbreeding reaches a threshold in an isolated
 * population (no immigration).
 *
 * Why: "how long until this population passes F = 0.1 (or 0.25)?" — a
 * headline figure for the record page and the brief.
 *
 * Formula (inverting SCIENCE.md eq. 4.1):
 *     t = ln[(1 − F*) / (1 − F_0)] / ln(1 − 1/(2Ne)),
 * with log1p in both logs. The result is real; the first whole generation at
 * or past the threshold is its ceiling (SCIENCE.md §4.1: Ne = 50, F* = 0.1 →
 * 10.48, i.e. 11 whole generations).
 * Assumptions: ideal isolated population, constant Ne (SCIENCE.md §4.1).
 * Reference: Wright, S. (1931). Evolution in Mendelian populations.
 *   Genetics 16: 97–159.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param targetInbreeding - F*, the threshold, in [F_0, 1)
 * @param initialInbreeding - F_0, in [0, 1); default 0
 * @returns t in generations (real), ≥ 0; 0 when F* = F_0; 0 at Ne = ½ (one
 *   generation of complete inbreeding already passes every threshold — the
 *   real-valued formula gives 0, the first whole generation is 1)
 * @throws RangeError if an argument is outside its domain
 * @example generationsToReachInbreeding({ effectiveSize: 50, targetInbreeding: 0.1 })    // 10.4832830657216
 * @example generationsToReachInbreeding({ effectiveSize: 100, targetInbreeding: 0.25 })  // 57.392453285978945
 * @example generationsToReachInbreeding({ effectiveSize: 50, targetInbreeding: 0.2, initialInbreeding: 0.2 })  // 0
 */
export function generationsToReachInbreeding({ effectiveSize, targetInbreeding, initialInbreeding = 0 }: {
  effectiveSize: number
  targetInbreeding: number
  initialInbreeding?: number
}): number {
  const fn = 'generationsToReachInbreeding'
  requireEffectiveSize(fn, 'effectiveSize', effectiveSize)
  requireInRange(fn, 'initialInbreeding', initialInbreeding, 0, 1)
  if (initialInbreeding === 1) domainError(fn, 'initialInbreeding', 'in [0, 1)', initialInbreeding)
  if (typeof targetInbreeding !== 'number' || !Number.isFinite(targetInbreeding) || targetInbreeding < initialInbreeding || targetInbreeding >= 1) {
    domainError(fn, 'targetInbreeding', `in [initialInbreeding, 1) = [${initialInbreeding}, 1)`, targetInbreeding)
  }
  const logRemaining = Math.log1p(-targetInbreeding) - Math.log1p(-initialInbreeding)
  // 0 / x and x / −Infinity give −0 in these cases; adding 0 normalises to +0.
  return logRemaining / logRetentionPerGeneration(effectiveSize) + 0
}
