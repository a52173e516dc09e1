import { domainError, requireFinite } from '../validate'

/** Below this y the series of r(y) replaces the closed form (which cancels). */
const SERIES_LIMIT = 0.5

/**
 * r(y) = 1 − (1 − e^(−y))/y and its derivative, by the series
 * Σ (−1)ⁿ⁺¹ yⁿ/(n+1)! for small y (no cancellation) and in closed form otherwise.
 */
function excessAndSlope(y: number): [number, number] {
  if (y < SERIES_LIMIT) {
    let value = 0
    let slope = 0
    let power = 1 // yⁿ⁻¹
    let factorial = 1 // (n+1)!
    for (let n = 1; n <= 30; n++) {
      factorial *= n + 1
      const sign = n % 2 === 1 ? 1 : -1
      slope += (sign * n * power) / factorial
      power *= y
      value += (sign * power) / factorial
      if (power / factorial < 1e-18 * value) break
    }
    return [value, slope]
  }
  const decay = Math.exp(-y)
  return [(Math.expm1(-y) + y) / y, (-Math.expm1(-y) - y * decay) / (y * y)]
}

/**
 * Survival probability of a single new copy under a Poisson branching process
 * with mean offspring 1 + h·s — the strong-selection, early-phase
 * approximation to establishment.
 *
 * Why: when selection is strong the fate of an introduced allele is decided
 * while it is rare; π is the classical answer for that phase and is shown as
 * a labelled approximation beside the diffusion (SCIENCE.md §1.4).
 *
 * Formula: π solves 1 − π = exp(−(1 + h·s)·π) (Haldane 1927-type argument);
 * π = 0 when h·s ≤ 0. Solved as (1 − e^(−y))/y = 1/(1 + h·s) for y = (1 + h·s)·π
 * by Newton's method: for 1 + h·s < 2 on r(y) = 1 − (1 − e^(−y))/y = h·s/(1 + h·s)
 * (increasing and concave, so Newton from y₀ = 2·r, below the root, climbs
 * monotonically; a series for r avoids cancellation at small h·s), otherwise
 * on y = (1 + h·s)·(1 − e^(−y)) from y₀ = 1 + h·s (no cancellation when π → 1).
 * For small h·s, π ≈ 2·h·s (Haldane's 2hs); π → 1 as h·s → ∞.
 * Assumptions: a very large population, the allele rare, offspring numbers
 * Poisson; describes only the early phase. Within 0.7% of the exact
 * Wright–Fisher chain for h = ½ and 4N·h·s ≥ 20; underestimates for h = ¼
 * and needs 4N·h·s ≳ 400 for h = 1 (SCIENCE.md §1.4).
 * Reference: Haldane, J.B.S. (1927). Proc. Camb. Phil. Soc. 23: 838–844
 *   (attribution from memory in SCIENCE.md §1.4).
 *
 * @param s - selection coefficient of AA per generation, 1 + s > 0
 * @param h - dominance, 1 + h·s > 0
 * @returns π, in [0, 1)
 * @throws RangeError if an argument is outside its domain
 * @example branchingSurvivalProbability({ s: 0.1, h: 0.5 })  // 0.0937018370729016
 * @example branchingSurvivalProbability({ s: 0.5, h: 1 })    // 0.582811643865811
 * @example branchingSurvivalProbability({ s: -0.1, h: 0.5 }) // 0
 */
export function branchingSurvivalProbability({ s, h }: { s: number, h: number }): number {
  const fn = 'branchingSurvivalProbability'
  requireFinite(fn, 's', s)
  if (!(1 + s > 0)) domainError(fn, 's', 'such that 1 + s > 0 (AA fitness positive)', s)
  requireFinite(fn, 'h', h)
  const heterozygoteAdvantage = h * s
  if (!(1 + heterozygoteAdvantage > 0)) domainError(fn, 'h', `such that 1 + h·s > 0 (Aa fitness positive; s = ${s})`, h)
  if (heterozygoteAdvantage <= 0) return 0
  const meanOffspring = 1 + heterozygoteAdvantage
  let y: number
  if (meanOffspring < 2) {
    // r(y) = h·s/(1 + h·s): Newton from 2·r, below the root of an increasing concave function.
    const target = heterozygoteAdvantage / meanOffspring
    y = 2 * target
    for (let iteration = 0; iteration < 100; iteration++) {
      const [value, slope] = excessAndSlope(y)
      const step = (target - value) / slope
      y += step
      if (!(Math.abs(step) > 4e-16 * y)) break
    }
  } else {
    // Strong selection: g(y) = y + λ·expm1(−y) = 0, increasing and convex past its
    // minimum; Newton from y = λ (where g = λ·e^(−λ) > 0) descends monotonically.
    y = meanOffspring
    for (let iteration = 0; iteration < 100; iteration++) {
      const step = (y + meanOffspring * Math.expm1(-y)) / (1 - meanOffspring * Math.exp(-y))
      y -= step
      if (!(Math.abs(step) > 4e-16 * y)) break
    }
  }
  return Math.min(y / meanOffspring, 1)
}
