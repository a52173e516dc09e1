/**
 * Diffusion limit: for large N and small s the exact Wright–Fisher chain must
 * approach Kimura's diffusion value (SCIENCE.md §1.6 grid, typed into
 * tests/fixtures/genetics/exact-chain-diffusion-limit.json; the fixation module
 * is deliberately not imported). SCIENCE.md §2.3 records that for 0 < s ≤ 0.01
 * the diffusion is within 0.45% of the chain for every N from 5 to 1000; the
 * diffusion drops O(s) relative terms, so at fixed N·s the gap must shrink in
 * proportion to s.
 */
import { describe, expect, it } from 'vitest'
import { exactFixationProbability } from '../../../shared/genetics/exact'
import fixture from '../../fixtures/genetics/exact-chain-diffusion-limit.json'

const gap = (census: number, s: number, h: number, diffusion: number) =>
  exactFixationProbability({ census, s, h, copies: 1 }) / diffusion - 1

describe('exact chain → diffusion for large N and small s', () => {
  it('has its source recorded', () => {
    expect(fixture.source).toMatch(/SCIENCE\.md §1\.6/)
  })
  it.each(fixture.cases.map(c => [c.census, c.s, c.h, c] as const))(
    'census %i, s = %f, h = %f: within 0.45% of the diffusion (SCIENCE.md §2.3)', (_n, _s, _h, { census, s, h, diffusion }) => {
      expect(Math.abs(gap(census, s, h, diffusion))).toBeLessThanOrEqual(0.0045)
    }, 60_000)
  it.each([0, 0.25, 0.5, 1])('h = %f: at 2N·s = 2 the gap shrinks ~10× from (N = 100, s = 0.01) to (N = 1000, s = 0.001)', (h) => {
    const find = (census: number, s: number) => {
      const row = fixture.cases.find(c => c.census === census && c.s === s && c.h === h)
      if (!row) throw new Error(`no fixture row for N=${census} s=${s} h=${h}`)
      return gap(census, s, h, row.diffusion)
    }
    const coarse = Math.abs(find(100, 0.01))
    const fine = Math.abs(find(1000, 0.001))
    expect(coarse).toBeGreaterThan(1e-3)
    expect(fine / coarse).toBeGreaterThan(0.05)
    expect(fine / coarse).toBeLessThan(0.15)
  }, 60_000)
})
