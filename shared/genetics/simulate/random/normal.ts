import type { RandomStream } from './streams'
import { uniform01 } from './uniform'

/**
 * One standard normal deviate, N(0, 1), by the Box–Muller transform
 * (Box & Muller 1958, Annals of Mathematical Statistics 29:610–611):
 * √(−2 ln U₁)·cos(2πU₂) with U₁ in (0, 1]. The second deviate of the pair is
 * discarded so the function stays stateless.
 *
 * @param random - seeded generator (advanced by four 32-bit draws)
 * @returns a real number; |value| ≤ 8.6 because U₁ ≥ 2⁻⁵³
 * @example sampleStandardNormal(replicateStream(1, 0)) // e.g. −0.41…
 */
export function sampleStandardNormal(random: RandomStream): number {
  const radius = Math.sqrt(-2 * Math.log(1 - uniform01(random)))
  return radius * Math.cos(2 * Math.PI * uniform01(random))
}
