import type { RandomStream } from './streams'

const TWO_POW_27 = 134217728
const TWO_POW_MINUS_53 = 1 / 9007199254740992

/**
 * Uniform number in [0, 1) with 53 random bits (two 32-bit draws: 26 + 27
 * bits), the same construction as pure-rand's `uniformFloat64`, written
 * inline because it sits in every inner loop.
 *
 * @param random - seeded generator (advanced by two draws)
 * @returns a multiple of 2⁻⁵³ in [0, 1)
 * @example uniform01(replicateStream(1, 0)) // e.g. 0.37…, always < 1
 */
export function uniform01(random: RandomStream): number {
  const high = random.next() >>> 6
  const low = random.next() >>> 5
  return (high * TWO_POW_27 + low) * TWO_POW_MINUS_53
}

/**
 * Uniform integer in {0, …, count − 1} as ⌊U·count⌋ with a 53-bit U.
 *
 * Accuracy: the largest deviation of any probability from 1/count is below
 * count·2⁻⁵³ (< 10⁻¹⁰ for count ≤ 10⁶), far below simulation noise; exact
 * rejection sampling is not worth its cost here.
 *
 * @param random - seeded generator (advanced by two draws)
 * @param count - number of outcomes, integer ≥ 1 (not checked: inner loop)
 * @returns an integer in [0, count − 1]
 * @example uniformIndex(replicateStream(1, 0), 6) // one of 0…5
 */
export function uniformIndex(random: RandomStream, count: number): number {
  return Math.floor(uniform01(random) * count)
}

const TWO_POW_MINUS_32 = 1 / 4294967296

/**
 * Uniform number in [0, 1) from one 32-bit draw: (next() mod 2³²)·2⁻³².
 *
 * Why: the binomial sampler draws one or two uniforms per Wright–Fisher
 * generation and this halves their cost. Resolution 2⁻³² ≈ 2.3·10⁻¹⁰: an
 * outcome's probability is reproduced to within that, far below what any
 * simulation of fewer than ~10⁹ draws can detect.
 *
 * @param random - seeded generator (advanced by one draw)
 * @returns a multiple of 2⁻³² in [0, 1)
 * @example uniform32(replicateStream(1, 0)) // e.g. 0.81…
 */
export function uniform32(random: RandomStream): number {
  return (random.next() >>> 0) * TWO_POW_MINUS_32
}
