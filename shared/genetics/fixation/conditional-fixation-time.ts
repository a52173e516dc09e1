import { logIntegralAdaptive } from './adaptive-log-quadrature'
import { diffusionExponent, requireCopies, requireSelectionInputs } from './fixation-inputs'
import type { FixationInputs } from './fixation-inputs'
import { logIntegralOfExponentialQuadratic } from './log-integral'
import { logAddExp } from './log-space'

/** Target relative error of each outer integral (well inside the 10⁻⁶ promised). */
const OUTER_TOLERANCE = 1e-10
/** Refinement limit for the outer integrals. */
const MAXIMUM_PANELS = 4000

/**
 * Mean number of generations until an introduced allele fixes, among the
 * runs in which it does fix (Kimura & Ohta's conditional fixation time).
 *
 * Why: tells a manager how long a successful introduced variant takes to
 * spread through the whole population — usually far beyond a management
 * horizon even when establishment is likely (SCIENCE.md §3).
 *
 * Formula (Kimura & Ohta 1969; SCIENCE.md eq. 3.1), with G from
 * `fixationProbability`, I(x) = ∫₀ˣ G, J(x) = ∫ₓ¹ G, T = I + J and p = k/(2N):
 *   t̄₁(p) = (4·Ne/T)·[ ∫ₚ¹ I(x)·J(x) / (x(1−x)·G(x)) dx
 *                      + (J(p)/I(p))·∫₀ᵖ I(x)² / (x(1−x)·G(x)) dx ],
 * which is ∫ₚ¹ ψ·u·(1−u) dx + ((1−u(p))/u(p))·∫₀ᵖ ψ·u² dx with 1 − u taken as
 * J/T directly (never 1 − u, which cancels under strong selection). Both
 * outer integrals run by adaptive Gauss–Kronrod in log space with starting
 * breakpoints at 0, p, 1, x* and geometric refinements at the scale
 * 1/(|4·Ne·s·h| + 2|2·Ne·s·(1−2h)| + 1); inner integrals as in the fixation
 * probability. s = 0 uses the closed form −4·Ne·(1−p)·ln(1−p)/p (→ 4·Ne as
 * p → 0). Relative error about 10⁻⁹ (tests require 10⁻⁶).
 * Assumptions: those of the diffusion (constant Ne, s, h; random mating; one
 * locus). The diffusion time is 1–3% short of the exact Wright–Fisher chain at
 * s = 0.1 and 14–16% short at s = 0.5 (SCIENCE.md §3.3). Generations, not
 * years: multiply by the generation length (SCIENCE.md §10).
 * Reference: Kimura, M. & Ohta, T. (1969). The average number of generations
 *   until fixation of a mutant gene in a finite population. Genetics 61: 763–771.
 *
 * @param census - N, census number of breeding diploid adults, integer ≥ 1
 * @param effectiveSize - Ne, effective size per generation, individuals, > 0
 * @param s - selection coefficient of AA per generation, 1 + s > 0
 * @param h - dominance, any real with 1 + h·s > 0
 * @param copies - k, A gene copies introduced, integer in [1, 2N] (2N → 0)
 * @returns mean generations to fixation given fixation, ≥ 0; with strong
 *   overdominance (h > 1, s > 0 or h < 0, s < 0) the allele is held at a
 *   balanced polymorphism and the time grows like e^(Ne·s·…), reaching
 *   Infinity beyond 1.8×10³⁰⁸ generations
 * @throws RangeError if an argument is outside its domain (copies = 0 has no
 *   fixation to condition on)
 * @example conditionalFixationTime({ census: 100, effectiveSize: 100, s: 0, h: 0.5, copies: 1 })         // 398.998329154125 (≈ 4·Ne)
 * @example conditionalFixationTime({ census: 1000, effectiveSize: 1000, s: 0.01, h: 0.5, copies: 1 })    // 1407.0598978...
 * @example conditionalFixationTime({ census: 10000, effectiveSize: 10000, s: 0.01, h: 0, copies: 1 })    // 3762.749047...
 * @example conditionalFixationTime({ census: 100, effectiveSize: 100, s: 0.01, h: 0.5, copies: 200 })    // 0
 */
export function conditionalFixationTime(inputs: FixationInputs): number {
  const fn = 'conditionalFixationTime'
  requireSelectionInputs(fn, inputs)
  const { census, effectiveSize, s, h, copies } = inputs
  requireCopies(fn, census, copies, 1)
  if (copies === 2 * census) return 0
  const frequency = copies / (2 * census)
  if (s === 0) return (-4 * effectiveSize * (1 - frequency) * Math.log1p(-frequency)) / frequency
  const { linear, quadratic } = diffusionExponent(effectiveSize, s, h)
  const logBelow = (x: number): number => logIntegralOfExponentialQuadratic(linear, quadratic, 0, x)
  const logAbove = (x: number): number => logIntegralOfExponentialQuadratic(linear, quadratic, x, 1)
  // log[x(1−x)·G(x)] with log G(x) = −(linear·x + quadratic·x²)
  const logDenominator = (x: number): number => Math.log(x) + Math.log1p(-x) - x * (linear + quadratic * x)
  const logBelowStart = logBelow(frequency)
  const logAboveStart = logAbove(frequency)
  const logTotal = logAddExp(logBelowStart, logAboveStart)
  const scale = 1 / (Math.abs(linear) + 2 * Math.abs(quadratic) + 1)
  const stationaryPoint = quadratic !== 0 ? -linear / (2 * quadratic) : NaN

  const logAfterStart = logIntegralAdaptive(
    x => logBelow(x) + logAbove(x) - logDenominator(x),
    startingBreakpoints(frequency, 1, stationaryPoint, scale),
    OUTER_TOLERANCE,
    MAXIMUM_PANELS,
  )
  const logBeforeStart = logIntegralAdaptive(
    x => 2 * logBelow(x) - logDenominator(x),
    startingBreakpoints(0, frequency, stationaryPoint, scale),
    OUTER_TOLERANCE,
    MAXIMUM_PANELS,
  )
  const logSum = logAddExp(logAfterStart, logAboveStart - logBelowStart + logBeforeStart)
  return 4 * effectiveSize * Math.exp(logSum - logTotal)
}

/**
 * Breakpoints for an outer integral on [lower, upper]: the ends, the
 * stationary point when inside, and points at distance scale·4ʲ from each.
 */
function startingBreakpoints(lower: number, upper: number, stationaryPoint: number, scale: number): number[] {
  const anchors = [lower, upper]
  if (stationaryPoint > lower && stationaryPoint < upper) anchors.push(stationaryPoint)
  const points = new Set<number>(anchors)
  for (const anchor of anchors) {
    for (let offset = scale; offset < upper - lower; offset *= 4) {
      if (anchor - offset > lower) points.add(anchor - offset)
      if (anchor + offset < upper) points.add(anchor + offset)
    }
  }
  return [...points].sort((first, second) => first - second)
}
