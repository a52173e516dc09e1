/**
 * WordStream must be pure-rand's xoroshiro128+ (the reference implementation here: pure-rand
 * 8.4.2's `xoroshiro128plus`) under another storage: the same outputs, states, clones and jumps,
 * wherever its words are kept.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { xoroshiro128plus, xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus'
import { WordStream } from '../../../shared/genetics/simulate/random/word-stream'

const draws = (stream: { next: () => number }, count: number): number[] => Array.from({ length: count }, () => stream.next())

describe('WordStream', () => {
  it('draws what pure-rand draws from the same state, and reports the same state', () => {
    fc.assert(fc.property(fc.integer(), (seed) => {
      const reference = xoroshiro128plus(seed)
      draws(reference, 3)
      const stream = new WordStream(reference.getState())
      expect(draws(stream, 200)).toEqual(draws(reference, 200))
      expect(stream.getState()).toEqual(reference.getState())
    }), { numRuns: 50 })
  })

  it('clones and jumps as pure-rand does', () => {
    const reference = xoroshiro128plus(99)
    const stream = new WordStream(reference.getState())
    const copy = stream.clone()
    reference.jump()
    stream.jump()
    expect(draws(stream, 20)).toEqual(draws(reference, 20))
    expect(draws(copy, 20)).toEqual(draws(xoroshiro128plus(99), 20))
  })

  it('keeps its place when its words move elsewhere and back', () => {
    const reference = xoroshiro128plus(5)
    const stream = new WordStream(reference.getState())
    const elsewhere = new Int32Array(8)
    expect(draws(stream, 7)).toEqual(draws(reference, 7))
    stream.relocate(elsewhere.subarray(2, 6))
    expect(draws(stream, 7)).toEqual(draws(reference, 7))
    expect(xoroshiro128plusFromState(stream.getState()).next()).toBe(xoroshiro128plusFromState(reference.getState()).next())
    stream.returnHome()
    elsewhere.fill(0)
    expect(draws(stream, 7)).toEqual(draws(reference, 7))
  })
})
