import { xoroshiro128plus, xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus'
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator'
import type { JumpableRandomGenerator } from 'pure-rand/types/JumpableRandomGenerator'
import { requireInteger } from '../../validate'
import { jumpedState } from './jump-table'
import { WordStream } from './word-stream'

/**
 * The seeded generator every stochastic engine function takes as a parameter.
 * It is pure-rand's `RandomGenerator` (xoroshiro128+ in practice): `next()`
 * returns a uniform signed 32-bit integer and advances the state in place.
 */
export type RandomStream = RandomGenerator

/**
 * Generator for one replicate: the seed's xoroshiro128+ stream advanced by
 * (replicate + 1) jumps of 2⁶⁴ steps.
 *
 * Why: each replicate must see the same random numbers whatever the number of
 * workers or the order in which replicates run, and replicates must not share
 * numbers. Jumping gives non-overlapping sub-sequences of one 2¹²⁸ − 1 period
 * (Blackman & Vigna 2018, "Scrambled linear pseudorandom number generators",
 * the jump polynomial implemented by pure-rand). Stream 0 (no jump) is kept for
 * quantities shared by all replicates (see `sharedStream`).
 * Cost: O(log replicate) table lookups (`jumpedState`); use
 * `ReplicateStreams` to walk a range of consecutive replicates.
 *
 * @param seed - any integer; only its low 32 bits are used (`seed | 0`)
 * @param replicate - replicate index, integer ≥ 0
 * @returns a fresh generator; advancing it does not affect any other stream
 * @throws RangeError if replicate is not an integer ≥ 0
 * @example replicateStream(42, 0).next() === replicateStream(42, 0).next() // true
 * @example replicateStream(42, 0).next() === replicateStream(42, 1).next() // false (almost surely)
 */
export function replicateStream(seed: number, replicate: number): JumpableRandomGenerator {
  requireInteger('replicateStream', 'replicate', replicate, 0)
  return xoroshiro128plusFromState(jumpedState(sharedStream(seed).getState(), replicate + 1))
}

/**
 * The seed's un-jumped stream (stream 0), used for inputs that every
 * replicate shares, such as the selection coefficients drawn for the load
 * loci; it never overlaps a replicate stream.
 *
 * @param seed - any integer; only its low 32 bits are used
 * @returns a fresh xoroshiro128+ generator
 * @example sharedStream(7).next() === sharedStream(7).next() // true
 */
export function sharedStream(seed: number): JumpableRandomGenerator {
  if (typeof seed !== 'number' || !Number.isInteger(seed)) {
    throw new RangeError(`sharedStream: seed must be an integer, got ${String(seed)}`)
  }
  return xoroshiro128plus(seed | 0)
}

/**
 * Walks the streams of replicates first, first + 1, … in one jump each, after
 * an O(log first) skip to the first.
 *
 * @example
 * const streams = new ReplicateStreams(42, 10)
 * streams.next() // same state as replicateStream(42, 10)
 * streams.next() // same state as replicateStream(42, 11)
 */
export class ReplicateStreams {
  /** State of the stream of the replicate before the next one. */
  private state: number[]

  /**
   * @param seed - any integer; only its low 32 bits are used
   * @param first - index of the first replicate to produce, integer ≥ 0
   */
  constructor(seed: number, first: number) {
    requireInteger('ReplicateStreams', 'first', first, 0)
    this.state = jumpedState(sharedStream(seed).getState(), first)
  }

  /** Stream of the next replicate in order. */
  next(): JumpableRandomGenerator {
    this.state = jumpedState(this.state, 1)
    return xoroshiro128plusFromState(this.state)
  }
}

/**
 * A child generator seeded from four 32-bit draws of a parent stream.
 *
 * Why: one replicate needs several independent sub-streams (burn-in of each
 * population, the translocation phase). Jumping would collide with the next
 * replicate's stream, so the child's 128-bit state is taken from the parent
 * instead (the usual "seed a child from its parent" scheme); overlap between a
 * child and any other stream in a run has probability of order 2⁻⁶⁴.
 *
 * The child is a `WordStream` (pure-rand's xoroshiro128+ with relocatable
 * state words), so that the rescue model's genome kernel can draw from it.
 *
 * @param parent - generator to draw the child's state from (advanced by 4 draws)
 * @returns a new xoroshiro128+ generator
 * @example spawnStream(replicateStream(1, 0)).next() // deterministic given the seed
 */
export function spawnStream(parent: RandomStream): JumpableRandomGenerator {
  const first = parent.next()
  const second = parent.next()
  const third = parent.next()
  const fourth = parent.next()
  // xoroshiro128+ must not start from the all-zero state (it would stay zero).
  const allZero = (first | second | third | fourth) === 0
  return new WordStream([allZero ? 1 : first, second, third, fourth])
}
