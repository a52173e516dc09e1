import { domainError } from '../../validate'
import type { RandomStream } from './streams'
import { uniform01 } from './uniform'

/**
 * Draws indices 0…n−1 with probability proportional to given weights in O(1)
 * per draw: Walker's alias method in Vose's numerically stable construction
 * (Vose 1991, IEEE Transactions on Software Engineering 17:972–975).
 *
 * Why: choosing each offspring's mother and father in proportion to fitness ×
 * reproductive weight, N times per generation.
 *
 * One 53-bit uniform U per draw: i = ⌊U·n⌋ picks a column and the fractional
 * part of U·n (≥ 33 random bits for n ≤ 10⁶) decides between the column and
 * its alias.
 *
 * @example
 * const sampler = new WeightedSampler([1, 0, 3])
 * sampler.sample(random) // 0 with probability ¼, 2 with probability ¾, never 1
 */
export class WeightedSampler {
  /** Number of categories. */
  readonly size: number
  /** Per column: the probability of keeping the column rather than taking its alias (read by the genome kernel's generation loop). */
  readonly threshold: Float64Array
  /** Per column: the index drawn when the column is not kept. */
  readonly alias: Int32Array

  /**
   * @param weights - finite numbers ≥ 0 with a positive sum
   * @throws RangeError if a weight is negative or not finite, or all are zero
   */
  constructor(weights: ArrayLike<number>) {
    const size = weights.length
    let total = 0
    for (let i = 0; i < size; i++) {
      const weight = weights[i] ?? 0
      if (!(weight >= 0) || !Number.isFinite(weight)) domainError('WeightedSampler', 'weights', 'finite numbers ≥ 0', weight)
      total += weight
    }
    if (!(total > 0)) domainError('WeightedSampler', 'weights', 'not all zero', total)
    this.size = size
    this.threshold = new Float64Array(size)
    this.alias = new Int32Array(size)
    const scaled = new Float64Array(size)
    const small = new Int32Array(size)
    const large = new Int32Array(size)
    let smallCount = 0
    let largeCount = 0
    for (let i = 0; i < size; i++) {
      const value = (weights[i] ?? 0) * size / total
      scaled[i] = value
      if (value < 1) small[smallCount++] = i
      else large[largeCount++] = i
    }
    while (smallCount > 0 && largeCount > 0) {
      const lessIndex = small[--smallCount] ?? 0
      const moreIndex = large[--largeCount] ?? 0
      this.threshold[lessIndex] = scaled[lessIndex] ?? 0
      this.alias[lessIndex] = moreIndex
      const leftover = (scaled[moreIndex] ?? 0) + (scaled[lessIndex] ?? 0) - 1
      scaled[moreIndex] = leftover
      if (leftover < 1) small[smallCount++] = moreIndex
      else large[largeCount++] = moreIndex
    }
    // What remains has scaled weight 1 up to rounding: keep the column, unless
    // rounding stranded a zero-weight column here, which must never be drawn.
    let heaviest = 0
    for (let i = 1; i < size; i++) if ((weights[i] ?? 0) > (weights[heaviest] ?? 0)) heaviest = i
    while (largeCount > 0) this.threshold[large[--largeCount] ?? 0] = 1
    while (smallCount > 0) {
      const index = small[--smallCount] ?? 0
      if ((weights[index] ?? 0) > 0) {
        this.threshold[index] = 1
      } else {
        this.threshold[index] = 0
        this.alias[index] = heaviest
      }
    }
  }

  /**
   * @param random - seeded generator (advanced by two 32-bit draws)
   * @returns an index in [0, size − 1]
   */
  sample(random: RandomStream): number {
    const position = uniform01(random) * this.size
    const column = Math.floor(position)
    // Both arrays have `size` entries and column < size, so the reads are defined.
    return position - column < (this.threshold[column] as number) ? column : this.alias[column] as number
  }
}
