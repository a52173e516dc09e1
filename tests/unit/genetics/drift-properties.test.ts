/**
 * Property tests (fast-check) for shared/genetics/drift: monotonicity,
 * bounds, inverses and agreement with the literal recurrence.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  equilibriumInbreeding,
  equilibriumInbreedingApproximation,
  generationsFromYears,
  generationsToReachInbreeding,
  heterozygosityRetained,
  inbreedingAfter,
  inbreedingTrajectory,
  migrationRateForEquilibriumInbreeding,
  yearsFromGenerations,
} from '../../../shared/genetics/drift'

const EPS = 2 ** -52
const effectiveSize = fc.double({ min: 0.5, max: 1e6, noNaN: true })
const moderateSize = fc.double({ min: 0.5, max: 5000, noNaN: true })
const realGenerations = fc.double({ min: 0, max: 2000, noNaN: true })
const wholeGenerations = fc.integer({ min: 0, max: 2000 })
const proportion = fc.double({ min: 0, max: 1, noNaN: true })

describe('heterozygosity retained', () => {
  it('is in [0, 1] and non-increasing in t', () => {
    fc.assert(fc.property(effectiveSize, realGenerations, realGenerations, (size, a, b) => {
      const [early, late] = a <= b ? [a, b] : [b, a]
      const hEarly = heterozygosityRetained({ effectiveSize: size, generations: early })
      const hLate = heterozygosityRetained({ effectiveSize: size, generations: late })
      expect(hLate).toBeGreaterThanOrEqual(0)
      expect(hEarly).toBeLessThanOrEqual(1)
      expect(hLate).toBeLessThanOrEqual(hEarly)
    }))
  })
  it('is non-decreasing in Ne', () => {
    fc.assert(fc.property(effectiveSize, effectiveSize, realGenerations, (a, b, t) => {
      const [small, large] = a <= b ? [a, b] : [b, a]
      expect(heterozygosityRetained({ effectiveSize: large, generations: t }))
        .toBeGreaterThanOrEqual(heterozygosityRetained({ effectiveSize: small, generations: t }))
    }))
  })
  it('strictly decreases from one whole generation to the next when Ne > ½ (while above underflow)', () => {
    fc.assert(fc.property(fc.double({ min: 0.6, max: 1e4, noNaN: true }), fc.integer({ min: 0, max: 500 }), (size, t) => {
      const now = heterozygosityRetained({ effectiveSize: size, generations: t })
      fc.pre(now > 1e-300)
      expect(heterozygosityRetained({ effectiveSize: size, generations: t + 1 })).toBeLessThan(now)
    }))
  })
  it('equals 1 − F_t for a non-inbred, isolated start', () => {
    fc.assert(fc.property(moderateSize, realGenerations, (size, t) => {
      const h = heterozygosityRetained({ effectiveSize: size, generations: t })
      const f = inbreedingAfter({ effectiveSize: size, generations: t })
      expect(Math.abs(h + f - 1)).toBeLessThanOrEqual(4 * EPS)
    }))
  })
})

describe('inbreeding after t generations', () => {
  it('is in [0, 1] for every valid input', () => {
    fc.assert(fc.property(effectiveSize, wholeGenerations, proportion, proportion, (size, t, f0, m) => {
      const f = inbreedingAfter({ effectiveSize: size, generations: t, initialInbreeding: f0, migrationRate: m })
      expect(f).toBeGreaterThanOrEqual(0)
      expect(f).toBeLessThanOrEqual(1)
    }))
  })
  it('is non-decreasing in t when m = 0', () => {
    fc.assert(fc.property(effectiveSize, realGenerations, realGenerations, proportion, (size, a, b, f0) => {
      const [early, late] = a <= b ? [a, b] : [b, a]
      expect(inbreedingAfter({ effectiveSize: size, generations: late, initialInbreeding: f0 }))
        .toBeGreaterThanOrEqual(inbreedingAfter({ effectiveSize: size, generations: early, initialInbreeding: f0 }))
    }))
  })
  it('is non-increasing in m for t ≥ 1', () => {
    fc.assert(fc.property(effectiveSize, fc.integer({ min: 1, max: 2000 }), proportion, proportion, proportion, (size, t, f0, a, b) => {
      const [low, high] = a <= b ? [a, b] : [b, a]
      const withMore = inbreedingAfter({ effectiveSize: size, generations: t, initialInbreeding: f0, migrationRate: high })
      const withLess = inbreedingAfter({ effectiveSize: size, generations: t, initialInbreeding: f0, migrationRate: low })
      // Equal m values may differ by rounding only.
      expect(withMore).toBeLessThanOrEqual(withLess * (1 + 8 * EPS))
    }))
  })
  it('is non-increasing in Ne when m = 0 and F_0 = 0', () => {
    fc.assert(fc.property(effectiveSize, effectiveSize, realGenerations, (a, b, t) => {
      const [small, large] = a <= b ? [a, b] : [b, a]
      expect(inbreedingAfter({ effectiveSize: large, generations: t }))
        .toBeLessThanOrEqual(inbreedingAfter({ effectiveSize: small, generations: t }))
    }))
  })
  it('agrees with literal double-precision iteration of the recurrence (SCIENCE.md eq. 4.2)', () => {
    fc.assert(fc.property(moderateSize, fc.integer({ min: 0, max: 300 }), proportion, proportion, (size, t, f0, m) => {
      let f = f0
      for (let generation = 0; generation < t; generation++) {
        f = (1 - m) ** 2 * (1 / (2 * size) + (1 - 1 / (2 * size)) * f)
      }
      const closed = inbreedingAfter({ effectiveSize: size, generations: t, initialInbreeding: f0, migrationRate: m })
      // The literal loop accumulates about one rounding per step.
      expect(Math.abs(closed - f)).toBeLessThanOrEqual((16 + 4 * t) * EPS * Math.max(f, Number.MIN_VALUE) + 1e-300)
    }))
  })
  it('approaches the island-model equilibrium', () => {
    fc.assert(fc.property(fc.double({ min: 0.5, max: 200, noNaN: true }), fc.double({ min: 0.01, max: 1, noNaN: true }), proportion, (size, m, f0) => {
      const equilibrium = equilibriumInbreeding({ effectiveSize: size, migrationRate: m })
      const late = inbreedingAfter({ effectiveSize: size, generations: 20_000, initialInbreeding: f0, migrationRate: m })
      expect(Math.abs(late - equilibrium)).toBeLessThanOrEqual(16 * EPS * Math.max(equilibrium, EPS))
    }))
  })
  it('moves monotonically towards the equilibrium from either side', () => {
    fc.assert(fc.property(moderateSize, fc.double({ min: 1e-4, max: 1, noNaN: true }), proportion, fc.integer({ min: 0, max: 200 }), (size, m, f0, t) => {
      const equilibrium = equilibriumInbreeding({ effectiveSize: size, migrationRate: m })
      const now = inbreedingAfter({ effectiveSize: size, generations: t, initialInbreeding: f0, migrationRate: m })
      const next = inbreedingAfter({ effectiveSize: size, generations: t + 1, initialInbreeding: f0, migrationRate: m })
      const slack = 8 * EPS
      expect(Math.abs(next - equilibrium)).toBeLessThanOrEqual(Math.abs(now - equilibrium) + slack)
    }))
  })
})

describe('inbreeding trajectory', () => {
  it('has t + 1 elements, starts at F_0 and matches inbreedingAfter element by element', () => {
    fc.assert(fc.property(effectiveSize, fc.integer({ min: 0, max: 300 }), proportion, proportion, (size, t, f0, m) => {
      const trajectory = inbreedingTrajectory({ effectiveSize: size, generations: t, initialInbreeding: f0, migrationRate: m })
      expect(trajectory).toHaveLength(t + 1)
      expect(trajectory[0]).toBe(f0)
      trajectory.forEach((value, generation) => {
        expect(value).toBe(inbreedingAfter({ effectiveSize: size, generations: generation, initialInbreeding: f0, migrationRate: m }))
      })
    }), { numRuns: 50 })
  })
})

describe('island-model equilibrium', () => {
  it('is in [0, 1], non-increasing in m and in Ne', () => {
    fc.assert(fc.property(effectiveSize, effectiveSize, proportion, proportion, (a, b, c, d) => {
      const [small, large] = a <= b ? [a, b] : [b, a]
      const [low, high] = c <= d ? [c, d] : [d, c]
      const value = equilibriumInbreeding({ effectiveSize: small, migrationRate: low })
      expect(value).toBeGreaterThanOrEqual(0)
      expect(value).toBeLessThanOrEqual(1)
      expect(equilibriumInbreeding({ effectiveSize: small, migrationRate: high })).toBeLessThanOrEqual(value * (1 + 4 * EPS))
      expect(equilibriumInbreeding({ effectiveSize: large, migrationRate: low })).toBeLessThanOrEqual(value * (1 + 4 * EPS))
    }))
  })
  it('is a fixed point of the recurrence', () => {
    fc.assert(fc.property(effectiveSize, fc.double({ min: 1e-9, max: 1, noNaN: true }), (size, m) => {
      const equilibrium = equilibriumInbreeding({ effectiveSize: size, migrationRate: m })
      const next = inbreedingAfter({ effectiveSize: size, generations: 1, initialInbreeding: equilibrium, migrationRate: m })
      expect(Math.abs(next - equilibrium)).toBeLessThanOrEqual(16 * EPS * equilibrium + 1e-300)
    }))
  })
  it('approximation 1/(4Nm + 1) converges to the exact value as m → 0 with Ne·m fixed', () => {
    fc.assert(fc.property(fc.double({ min: 0.1, max: 10, noNaN: true }), (migrants) => {
      const [coarse = Number.NaN, middle = Number.NaN, fine = Number.NaN] = [1e2, 1e4, 1e6].map((size) => {
        const migrationRate = migrants / size
        return Math.abs(equilibriumInbreedingApproximation({ effectiveSize: size, migrationRate }) - equilibriumInbreeding({ effectiveSize: size, migrationRate }))
      })
      expect(middle).toBeLessThan(coarse)
      expect(fine).toBeLessThan(middle)
    }))
  })
  it('migrationRateForEquilibriumInbreeding inverts equilibriumInbreeding', () => {
    fc.assert(fc.property(effectiveSize, fc.double({ min: 1e-6, max: 1, noNaN: true }), (size, target) => {
      const m = migrationRateForEquilibriumInbreeding({ effectiveSize: size, targetInbreeding: target })
      expect(m).toBeGreaterThanOrEqual(0)
      expect(m).toBeLessThanOrEqual(1)
      const back = equilibriumInbreeding({ effectiveSize: size, migrationRate: m })
      // Forming 1 − m near m = 1 costs eps/(1 − m) relative (conditioning of the forward map).
      expect(Math.abs(back - target)).toBeLessThanOrEqual(64 * EPS * target * (1 + 1 / (1 - m)))
    }))
  })
})

describe('inverses in time', () => {
  it('generationsToReachInbreeding inverts inbreedingAfter', () => {
    fc.assert(fc.property(fc.double({ min: 0.6, max: 1e5, noNaN: true }), fc.double({ min: 0, max: 0.9, noNaN: true }), fc.double({ min: 1e-6, max: 0.99, noNaN: true }), (size, f0, share) => {
      const target = f0 + (1 - f0) * share
      fc.pre(target < 1)
      const t = generationsToReachInbreeding({ effectiveSize: size, targetInbreeding: target, initialInbreeding: f0 })
      const reached = inbreedingAfter({ effectiveSize: size, generations: t, initialInbreeding: f0 })
      expect(Math.abs(reached - target)).toBeLessThanOrEqual(1e-12 * target)
    }))
  })
  it('yearsFromGenerations inverts generationsFromYears', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 1e5, noNaN: true }), fc.double({ min: 0.1, max: 100, noNaN: true }), (years, generationTime) => {
      const back = yearsFromGenerations({ generations: generationsFromYears({ years, generationTime }), generationTime })
      expect(Math.abs(back - years)).toBeLessThanOrEqual(2 * EPS * years + 1e-300) // subnormal years underflow
    }))
  })
})
