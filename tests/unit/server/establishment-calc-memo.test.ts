/**
 * The calc route's memory of answers (server/utils/establishment-calc-memo.ts): the figures are
 * the computation's own (reference: `establishmentCalc`, itself checked against the engine and
 * SCIENCE.md's values in tests/api/calc.test.ts), computed once per distinct input, frozen, bounded, and refusals are not remembered.
 */
import { describe, expect, it } from 'vitest'
import { CALC_MEMO_SIZE, rememberedEstablishmentCalc } from '../../../server/utils/establishment-calc-memo'
import { establishmentCalc } from '../../../server/utils/proposal-calc'

describe('remembered establishment calculations', () => {
  it('are the computation\'s answers, the same frozen object for the same input', () => {
    const copies = { census: 50, effectiveSize: 50, s: 0.05, h: 0.5, copies: 3 }
    const release = { census: 400, effectiveSize: 120, s: 0.05, h: 0.5, migrantsPerEvent: 4, sourceFrequency: 0.5 }
    for (const input of [copies, release]) {
      const first = rememberedEstablishmentCalc(input)
      expect(first).toEqual(establishmentCalc(input))
      expect(rememberedEstablishmentCalc({ ...input })).toBe(first)
      expect(Object.isFrozen(first)).toBe(true)
      expect(Object.isFrozen(first.diffusion)).toBe(true)
    }
    expect(rememberedEstablishmentCalc({ ...copies, copies: 4 })).not.toBe(rememberedEstablishmentCalc(copies))
    // copies: 3 and migrantsPerEvent-style inputs never share a key.
    expect(rememberedEstablishmentCalc({ ...release })).not.toBe(rememberedEstablishmentCalc(copies))
  })

  it('throw the engine\'s RangeError each time for inputs outside its domain', () => {
    const bad = { census: 50, effectiveSize: 50, s: -2, h: 0.5, copies: 1 }
    expect(() => rememberedEstablishmentCalc(bad)).toThrow(RangeError)
    expect(() => rememberedEstablishmentCalc(bad)).toThrow(RangeError)
  })

  it(`keep at most ${CALC_MEMO_SIZE} answers, forgetting the least recently used`, () => {
    const keep = rememberedEstablishmentCalc({ census: 20, effectiveSize: 20, s: 0.01, h: 0.5, copies: 1 })
    const first = rememberedEstablishmentCalc({ census: 10, effectiveSize: 10, s: 0.001, h: 0.5, copies: 1 })
    for (let i = 1; i <= CALC_MEMO_SIZE; i++) {
      rememberedEstablishmentCalc({ census: 10, effectiveSize: 10, s: 0.001 * (i + 1), h: 0.5, copies: 1 })
      if (i % 100 === 0) expect(rememberedEstablishmentCalc({ census: 20, effectiveSize: 20, s: 0.01, h: 0.5, copies: 1 })).toBe(keep)
    }
    const again = rememberedEstablishmentCalc({ census: 10, effectiveSize: 10, s: 0.001, h: 0.5, copies: 1 })
    expect(again).not.toBe(first)
    expect(again).toEqual(first)
  })
})
