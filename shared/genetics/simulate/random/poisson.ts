import { domainError } from '../../validate'
import { logFactorial } from './log-factorial'
import type { RandomStream } from './streams'
import { uniform01 } from './uniform'

/** Below this mean the sampler multiplies uniforms; above it uses PTRS. */
export const POISSON_MULTIPLICATION_LIMIT = 10

/**
 * One draw from Poisson(mean): e.g. the number of new harmful mutations in a
 * gamete when the genomic mutation rate is U.
 *
 * Method (exact): mean < 10 — Knuth's product of uniforms (count how many
 * uniforms can be multiplied before the product drops below e^(−mean));
 * mean ≥ 10 — the transformed rejection method with squeeze "PTRS" of
 * Hörmann (1993, Insurance: Mathematics and Economics 12:39–45).
 *
 * @param random - seeded generator
 * @param mean - λ, finite ≥ 0
 * @returns an integer ≥ 0
 * @throws RangeError if mean is negative or not finite
 * @example samplePoisson(replicateStream(1, 0), 0) // 0
 * @example samplePoisson(replicateStream(1, 0), 0.5) // usually 0 or 1
 */
export function samplePoisson(random: RandomStream, mean: number): number {
  if (!(mean >= 0) || !Number.isFinite(mean)) domainError('samplePoisson', 'mean', 'a finite number ≥ 0', mean)
  if (mean === 0) return 0
  if (mean < POISSON_MULTIPLICATION_LIMIT) {
    const limit = Math.exp(-mean)
    let count = 0
    let product = uniform01(random)
    while (product > limit) {
      count++
      product *= uniform01(random)
    }
    return count
  }
  return poissonPtrs(random, mean)
}

/** Hörmann's PTRS for mean ≥ 10. */
function poissonPtrs(random: RandomStream, mean: number): number {
  const rootMean = Math.sqrt(mean)
  const logMean = Math.log(mean)
  const b = 0.931 + 2.53 * rootMean
  const a = -0.059 + 0.02483 * b
  const inverseAlpha = 1.1239 + 1.1328 / (b - 3.4)
  const acceptanceLimit = 0.9277 - 3.6224 / (b - 2)
  for (;;) {
    const u = uniform01(random) - 0.5
    const v = uniform01(random)
    const us = 0.5 - Math.abs(u)
    const k = Math.floor((2 * a / us + b) * u + mean + 0.43)
    if (us >= 0.07 && v <= acceptanceLimit) return k
    if (k < 0 || (us < 0.013 && v > us)) continue
    if (Math.log(v) + Math.log(inverseAlpha) - Math.log(a / (us * us) + b) <= -mean + k * logMean - logFactorial(k)) return k
  }
}
