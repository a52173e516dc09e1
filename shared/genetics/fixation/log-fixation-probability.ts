import { diffusionExponent, requireCopies, requireSelectionInputs } from './fixation-inputs'
import type { FixationInputs } from './fixation-inputs'
import { logIntegralOfExponentialQuadratic } from './log-integral'
import { logAddExp } from './log-space'

/**
 * Below this value of |linear| + |quadratic| (the largest |exponent| of G on
 * [0, 1]) the first-order near-neutral series is used; its relative error is
 * of order (|linear| + |quadratic|)² ≤ 10⁻¹².
 */
const NEAR_NEUTRAL_LIMIT = 1e-6

/**
 * Natural log of Kimura's diffusion fixation probability (internal; the
 * public functions `fixationProbability` and `log10FixationProbability`
 * validate their inputs with their own names and call this).
 *
 * u = A / (A + B) with A = ∫₀ᵖ G and B = ∫ₚ¹ G, each computed as a positive
 * integral in log space, so neither u nor 1 − u is formed by subtraction.
 * Near neutrality the series u ≈ p + p(1−p)·[linear/2 + quadratic·(1+p)/3]
 * (SCIENCE.md §1.5 item 3) is used; s = 0 gives exactly log p.
 */
export function logFixationProbabilityChecked(fn: string, inputs: FixationInputs): number {
  requireSelectionInputs(fn, inputs)
  const { census, effectiveSize, s, h, copies } = inputs
  requireCopies(fn, census, copies, 0)
  if (copies === 0) return -Infinity
  if (copies === 2 * census) return 0
  const frequency = copies / (2 * census)
  if (s === 0) return Math.log(frequency)
  const { linear, quadratic } = diffusionExponent(effectiveSize, s, h)
  if (Math.abs(linear) + Math.abs(quadratic) < NEAR_NEUTRAL_LIMIT) {
    const correction = frequency * (1 - frequency) * (linear / 2 + (quadratic * (1 + frequency)) / 3)
    return Math.log(frequency + correction)
  }
  const logBelow = logIntegralOfExponentialQuadratic(linear, quadratic, 0, frequency)
  const logAbove = logIntegralOfExponentialQuadratic(linear, quadratic, frequency, 1)
  return logBelow - logAddExp(logBelow, logAbove)
}
