import type { JumpableRandomGenerator } from 'pure-rand/types/JumpableRandomGenerator'
import { jumpedState } from './jump-table'

/**
 * Writes a xoroshiro128+ state given in pure-rand's `getState()` order ([high s0, low s0,
 * high s1, low s1]) as the kernels keep it: s0 and s1 as little-endian 64-bit words, i.e.
 * [low s0, high s0, low s1, high s1], at words[offset …].
 */
export function writeKernelState(state: readonly number[], words: Int32Array, offset: number): void {
  words[offset] = state[1] ?? 0
  words[offset + 1] = state[0] ?? 0
  words[offset + 2] = state[3] ?? 0
  words[offset + 3] = state[2] ?? 0
}

/** The state kept by the kernels at words[offset …] (see `writeKernelState`), in pure-rand's order. */
export function readKernelState(words: Int32Array, offset: number): number[] {
  return [words[offset + 1] as number, words[offset] as number, words[offset + 3] as number, words[offset + 2] as number]
}

/**
 * pure-rand's xoroshiro128+ (the same `next()`, operation for operation) with its state in four
 * int32 words that can be moved into a WebAssembly kernel's memory (`relocate`), so that
 * TypeScript and the kernel draw from one stream in turn.
 *
 * Why: the rescue model's gametes take one random word per heterozygous 32-locus word of the
 * genome, and those loops run in the genome kernel (kernels/genome.ts) while parent choice and
 * mutations stay in TypeScript, all from the phase's stream in the original order. The words
 * are kept as the two 64-bit state words, little-endian ([low s0, high s0, low s1, high s1]),
 * which is how the kernel reads them; `getState()` answers in pure-rand's order
 * ([high s0, low s0, high s1, low s1]), so pure-rand's `xoroshiro128plusFromState(getState())`
 * continues the same stream (tests/unit/genetics/word-stream.test.ts).
 */
export class WordStream implements JumpableRandomGenerator {
  /** Where the state is now: `own`, or a kernel's state words while relocated. */
  private words: Int32Array
  private readonly own: Int32Array

  /** @param state - a xoroshiro128+ state in pure-rand's `getState()` order, not all zero */
  constructor(state: readonly number[]) {
    this.own = new Int32Array(4)
    writeKernelState(state, this.own, 0)
    this.words = this.own
  }

  /** pure-rand's `next()`: the low 32 bits of s0 + s1, then the xoroshiro128+ step (a = 24, b = 16, c = 37). */
  next(): number {
    const words = this.words
    // Four words exist by construction, hence the `as number` reads.
    const low0 = words[0] as number
    const high0 = words[1] as number
    const low1 = words[2] as number
    const high1 = words[3] as number
    const out = low0 + low1 | 0
    const mixedLow = low1 ^ low0
    const mixedHigh = high1 ^ high0
    words[0] = low0 << 24 ^ high0 >>> 8 ^ mixedLow ^ mixedLow << 16
    words[1] = high0 << 24 ^ low0 >>> 8 ^ mixedHigh ^ (mixedHigh << 16 | mixedLow >>> 16)
    words[2] = mixedHigh << 5 ^ mixedLow >>> 27
    words[3] = mixedLow << 5 ^ mixedHigh >>> 27
    return out
  }

  /** The state in pure-rand's order. */
  getState(): readonly number[] {
    return readKernelState(this.words, 0)
  }

  clone(): WordStream {
    return new WordStream(this.getState())
  }

  /** Advances by 2⁶⁴ steps, as pure-rand's `jump()`. */
  jump(): void {
    writeKernelState(jumpedState(this.getState(), 1), this.words, 0)
  }

  /** Moves the state into `target` (four int32 words, e.g. a kernel's); draws then read and advance it there. */
  relocate(target: Int32Array): void {
    target.set(this.words.subarray(0, 4))
    this.words = target
  }

  /** Brings the state back from where `relocate` put it. */
  returnHome(): void {
    if (this.words === this.own) return
    this.own.set(this.words.subarray(0, 4))
    this.words = this.own
  }
}
