import { domainError } from '../../validate'
import { sampleStandardNormal } from './normal'
import type { RandomStream } from './streams'
import { uniform01 } from './uniform'

/**
 * One draw from a gamma distribution with the given shape and scale
 * (mean shape·scale, variance shape·scale²).
 *
 * Why: selection coefficients of harmful mutations (a gamma distribution of
 * fitness effects) and parents' reproductive weights (which set the variance
 * of family size).
 *
 * Method (exact): Marsaglia & Tsang (2000, ACM Transactions on Mathematical
 * Software 26:363–372) squeeze-and-reject for shape ≥ 1; for shape < 1 a
 * draw at shape + 1 multiplied by U^(1/shape) (their boosting step).
 *
 * @param random - seeded generator
 * @param shape - k, finite > 0
 * @param scale - θ, finite > 0; default 1
 * @returns a real number > 0 (may underflow to 0 for tiny shapes)
 * @throws RangeError if shape or scale is not finite and positive
 * @example sampleGamma(replicateStream(1, 0), 2, 0.5) // mean 1
 */
export function sampleGamma(random: RandomStream, shape: number, scale = 1): number {
  if (!(shape > 0) || !Number.isFinite(shape)) domainError('sampleGamma', 'shape', 'a finite number > 0', shape)
  if (!(scale > 0) || !Number.isFinite(scale)) domainError('sampleGamma', 'scale', 'a finite number > 0', scale)
  if (shape < 1) {
    const boost = Math.pow(uniform01(random), 1 / shape)
    return sampleGammaShapeAtLeastOne(random, shape + 1) * boost * scale
  }
  return sampleGammaShapeAtLeastOne(random, shape) * scale
}

function sampleGammaShapeAtLeastOne(random: RandomStream, shape: number): number {
  const d = shape - 1 / 3
  const c = 1 / Math.sqrt(9 * d)
  for (;;) {
    const x = sampleStandardNormal(random)
    const root = 1 + c * x
    if (root <= 0) continue
    const v = root * root * root
    const u = uniform01(random)
    const xSquare = x * x
    if (u < 1 - 0.0331 * xSquare * xSquare) return d * v
    if (Math.log(u) < 0.5 * xSquare + d * (1 - v + Math.log(v))) return d * v
  }
}
