/**
 * How proposal results print (shared/proposals/format.ts), including the display rule for
 * very small probabilities of SCIENCE.md §1.5 and §10.
 */
import { describe, expect, it } from 'vitest'
import { formatNumber, formatProbability, formatRelative, formatYears, oneIn } from '#shared/proposals/format'

describe('formatProbability', () => {
  it.each([
    [0.13645, '13.6%'],
    [0.0481, '4.81%'],
    [4.2e-4, '0.042%'],
    [1.2e-6, '0.00012%'],
    [9.9e-7, '< 1 in a million'],
    [0, '0%'],
    [1, '100%'],
    [0.9999999, '> 99.9999%'],
  ])('%s → %s', (probability, text) => {
    expect(formatProbability(probability)).toBe(text)
  })

  it('shows an underflowed probability as a power of ten from its logarithm', () => {
    expect(formatProbability(0, -8599.03)).toBe('9.3 × 10^-8600')
  })
})

describe('other formats', () => {
  it('oneIn', () => {
    expect(oneIn(0.0042)).toBe('about 1 in 240')
    expect(oneIn(0.5)).toBe('about 1 in 2')
    expect(oneIn(0)).toBe('practically never')
  })

  it('formatRelative, formatNumber, formatYears', () => {
    expect(formatRelative(0.0080416)).toBe('+0.80%')
    expect(formatRelative(-0.2851)).toBe('−29%')
    expect(formatRelative(null)).toBe('—')
    expect(formatNumber(1234.567)).toBe('1,235')
    expect(formatNumber(0.31168, 2)).toBe('0.31')
    expect(formatYears(101.84)).toBe('102 years')
    expect(formatYears(1)).toBe('1 year')
  })
})
