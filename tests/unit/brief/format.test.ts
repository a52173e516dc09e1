/** How numbers and dates print in a brief (common practice, no source: formatting rules). */
import { describe, expect, it } from 'vitest'
import { formatChange, formatDate, formatDateTime, formatFitness, formatFixed, formatMigrants, formatNumber, formatProbability, plural } from '../../../server/brief/format'

describe('brief formatting', () => {
  it('probabilities follow the app\'s display rule', () => {
    expect(formatProbability(0.13645)).toBe('13.6%')
    expect(formatProbability(3e-9)).toBe('< 1 in a million')
    expect(formatProbability(0)).toBe('0%')
  })
  it('relative change', () => {
    expect(formatChange(1.25, 1)).toBe('+25%')
    expect(formatChange(0.8, 1)).toBe('−20%')
    expect(formatChange(1.0004, 1)).toBe('±0%')
    expect(formatChange(1.05, 1)).toBe('+5.0%')
    expect(formatChange(1, 0)).toBe('—')
  })
  it('migrants, fixed digits, numbers', () => {
    expect(formatMigrants(0.4167)).toBe('0.42')
    expect(formatMigrants(12.5)).toBe('13')
    expect(formatMigrants(0)).toBe('0')
    expect(formatFixed(0.09561, 3)).toBe('0.096')
    expect(formatFixed(Number.NaN, 3)).toBe('—')
    expect(formatNumber(12345.678)).toBe('12,346')
    expect(formatNumber(null)).toBe('—')
    expect(plural(1, 'release', 'releases')).toBe('1 release')
    expect(plural(3, 'release', 'releases')).toBe('3 releases')
  })
  it('fitness keeps two significant figures when it is small', () => {
    expect(formatFitness(0.8123)).toBe('0.81')
    expect(formatFitness(0.00853)).toBe('0.0085')
    expect(formatFitness(0)).toBe('0.00')
    expect(formatFitness(Number.NaN)).toBe('—')
  })
  it('dates print in UTC whatever the server\'s zone', () => {
    expect(formatDate('2026-03-14T23:30:00.000Z')).toBe('14 March 2026')
    expect(formatDateTime('2026-03-14T09:05:00.000Z')).toBe('14 March 2026, 09:05 UTC')
    expect(formatDate(null)).toBe('—')
    expect(formatDate('not a date')).toBe('—')
  })
})
