/**
 * The server's memory of exact-chain vectors (server/utils/exact-chain-memo.ts): the numbers are
 * the engine's own (reference: the engine's exactFixationProbabilities, itself checked against
 * SCIENCE.md's mpmath values in tests/unit/genetics), computed once per (census, s, h), with a
 * bounded number of entries.
 */
import { describe, expect, it } from 'vitest'
import { exactFixationProbabilities, exactFixationProbability } from '../../../shared/genetics'
import { EXACT_CHAIN_MEMO_SIZE, rememberedExactVector } from '../../../server/utils/exact-chain-memo'

describe('remembered exact-chain vectors', () => {
  it('are the engine vectors, and the same array on the second call', () => {
    const chain = { census: 60, s: 0.05, h: 0.5 }
    const first = rememberedExactVector(chain)
    expect(Array.from(first!)).toEqual(Array.from(exactFixationProbabilities(chain)))
    expect(first![7]).toBe(exactFixationProbability({ ...chain, copies: 7 }))
    expect(rememberedExactVector({ ...chain })).toBe(first)
    expect(rememberedExactVector({ ...chain, h: 0.4 })).not.toBe(first)
  })

  it(`keep at most ${EXACT_CHAIN_MEMO_SIZE} chains, forgetting the least recently used`, () => {
    const keep = rememberedExactVector({ census: 5, s: 0.01, h: 0.5 })
    const first = rememberedExactVector({ census: 3, s: 0.001, h: 0.5 })
    for (let i = 1; i < EXACT_CHAIN_MEMO_SIZE; i++) {
      rememberedExactVector({ census: 3, s: 0.001 * (i + 1), h: 0.5 })
      if (i % 50 === 0) expect(rememberedExactVector({ census: 5, s: 0.01, h: 0.5 })).toBe(keep) // used again: kept
    }
    // 257 chains asked for: the least recently used one (the first census-3 chain) was forgotten.
    expect(rememberedExactVector({ census: 5, s: 0.01, h: 0.5 })).toBe(keep)
    const again = rememberedExactVector({ census: 3, s: 0.001, h: 0.5 })
    expect(again).not.toBe(first)
    expect(Array.from(again!)).toEqual(Array.from(first!))
  })

  it('does not remember inputs the engine refuses', () => {
    expect(() => rememberedExactVector({ census: 10, s: -1, h: 0.5 })).toThrow(RangeError)
    expect(() => rememberedExactVector({ census: 10, s: -1, h: 0.5 })).toThrow(RangeError)
  })
})
