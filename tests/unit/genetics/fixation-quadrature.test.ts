/**
 * Internal numerics of the fixation module: Gauss–Legendre rules, the panel
 * integrator for exp(quadratic) and the log-space adaptive Gauss–Kronrod
 * rule, checked against closed forms (exact polynomial integrals, the
 * exponential and Gaussian integrals written with expm1 and erf-free forms).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { gaussLegendreRule } from '../../../shared/genetics/fixation/gauss-legendre'
import { logIntegralOfExponentialQuadratic } from '../../../shared/genetics/fixation/log-integral'
import { logIntegralAdaptive } from '../../../shared/genetics/fixation/adaptive-log-quadrature'
import { PANEL_ORDERS, panelOrder } from '../../../shared/genetics/fixation/panel-order'
import { logAddExp } from '../../../shared/genetics/fixation/log-space'

describe('gaussLegendreRule', () => {
  for (const order of PANEL_ORDERS) {
    it(`${order}-point rule integrates x^d exactly for d ≤ ${2 * order - 1}`, () => {
      const { nodes, weights } = gaussLegendreRule(order)
      expect(nodes.length).toBe(order)
      for (let degree = 0; degree <= 2 * order - 1; degree++) {
        let sum = 0
        for (let index = 0; index < order; index++) sum += (weights[index] ?? 0) * (nodes[index] ?? 0) ** degree
        const exact = degree % 2 === 1 ? 0 : 2 / (degree + 1)
        expect(Math.abs(sum - exact)).toBeLessThanOrEqual(4e-15)
      }
    })
  }

  it('returns the same cached rule on repeated calls', () => {
    expect(gaussLegendreRule(12)).toBe(gaussLegendreRule(12))
  })
})

describe('panelOrder', () => {
  it('asks for more points for larger variation or tighter tolerance', () => {
    expect(panelOrder(1e-5, 1e-15)).toBe(3)
    expect(panelOrder(8, 2e-15)).toBe(16)
    expect(panelOrder(8, 1e-6)).toBe(10)
    expect(panelOrder(100, 1e-15)).toBe(24)
  })
})

describe('logIntegralOfExponentialQuadratic', () => {
  it('matches the linear closed form (1 − e^(−a·L))·e^(−a·x₀)/a for any slope', () => {
    fc.assert(fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (slope, x, y) => {
      const lower = Math.min(x, y)
      const upper = Math.max(x, y)
      const length = upper - lower
      // The reference formula itself loses precision for subnormal products.
      if (!(Math.abs(slope) * length > 1e-250)) return
      // log of e^(−a·x_peak)·L·(1 − e^(−|a|·L))/(|a|·L), the peak at the lower end for a > 0
      const drop = Math.abs(slope) * length
      const expected = -slope * (slope > 0 ? lower : upper) + Math.log(length) + Math.log(-Math.expm1(-drop) / drop)
      const actual = logIntegralOfExponentialQuadratic(slope, 0, lower, upper)
      expect(Math.abs(actual - expected)).toBeLessThanOrEqual(1e-13 * Math.max(1, Math.abs(expected)))
    }), { numRuns: 1000 })
  })

  it('matches the full Gaussian integral √(π/b) when the peak is deep inside [0, 1]', () => {
    for (const curvature of [1e3, 1e4, 1e5, 1e6]) {
      // exp(−(−b·x + b·x²)) = exp(b/4 − b(x − ½)²)
      const logIntegral = logIntegralOfExponentialQuadratic(-curvature, curvature, 0, 1) - curvature / 4
      expect(Math.abs(logIntegral - 0.5 * Math.log(Math.PI / curvature))).toBeLessThanOrEqual(1e-14 * curvature)
    }
  })

  it('matches the half-Gaussian and trough forms via Dawson-free identities', () => {
    // ∫₀^∞ e^(−b x²) = ½√(π/b); with b = 10⁴ the cut at x = 1 is negligible.
    const half = logIntegralOfExponentialQuadratic(0, 1e4, 0, 1)
    expect(Math.abs(half - Math.log(0.5 * Math.sqrt(Math.PI / 1e4)))).toBeLessThanOrEqual(1e-14)
    // Convex exponent: ∫₀¹ e^(b x²) ≈ e^b/(2b)·(1 + 1/(2b) + 3/(4b²) + …) for large b.
    const b = 1e5
    const trough = logIntegralOfExponentialQuadratic(0, -b, 0, 1)
    const asymptotic = b - Math.log(2 * b) + Math.log1p(1 / (2 * b) + 3 / (4 * b * b) + 15 / (8 * b ** 3))
    expect(Math.abs(trough - asymptotic)).toBeLessThanOrEqual(1e-10)
  })

  it('is additive over adjacent intervals', () => {
    fc.assert(fc.property(
      fc.double({ min: -1e4, max: 1e4, noNaN: true }), fc.double({ min: -1e4, max: 1e4, noNaN: true }),
      fc.double({ min: 0.001, max: 0.999, noNaN: true }),
      (linear, quadratic, split) => {
        const whole = logIntegralOfExponentialQuadratic(linear, quadratic, 0, 1)
        const parts = logAddExp(
          logIntegralOfExponentialQuadratic(linear, quadratic, 0, split),
          logIntegralOfExponentialQuadratic(linear, quadratic, split, 1),
        )
        expect(Math.abs(whole - parts)).toBeLessThanOrEqual(1e-13 * Math.max(1, Math.abs(whole)))
      },
    ), { numRuns: 1000 })
  })

  it('returns −Infinity for an empty interval', () => {
    expect(logIntegralOfExponentialQuadratic(1, 1, 0.5, 0.5)).toBe(-Infinity)
  })
})

describe('logIntegralAdaptive', () => {
  it('uses a 15-point Kronrod rule exact for polynomials of degree ≤ 22 (one panel, no refinement)', () => {
    for (let degree = 0; degree <= 22; degree++) {
      const logValue = logIntegralAdaptive(x => degree * Math.log(x), [0, 1], 1, 1)
      expect(Math.abs(Math.exp(logValue) * (degree + 1) - 1)).toBeLessThanOrEqual(4e-15)
    }
    // …and not beyond: on [−1, 1], x²⁴ is no longer integrated exactly (2/25).
    const exactEven = logIntegralAdaptive(x => 22 * Math.log(Math.abs(x)), [-1, 1], 1, 1)
    expect(Math.abs(Math.exp(exactEven) * 23 / 2 - 1)).toBeLessThanOrEqual(4e-15)
    const beyond = logIntegralAdaptive(x => 24 * Math.log(Math.abs(x)), [-1, 1], 1, 1)
    expect(Math.abs(Math.exp(beyond) * 25 / 2 - 1)).toBeGreaterThan(1e-9)
  })

  it('integrates smooth and peaked integrands given as logarithms', () => {
    expect(logIntegralAdaptive(x => Math.log(x), [0, 1], 1e-12, 500)).toBeCloseTo(Math.log(0.5), 13)
    // ∫₀¹ e^(1000·x) dx = (e^1000 − 1)/1000, far beyond double range
    const huge = logIntegralAdaptive(x => 1000 * x, [0, 1], 1e-12, 2000)
    expect(Math.abs(huge - (1000 + Math.log1p(-Math.exp(-1000)) - Math.log(1000)))).toBeLessThanOrEqual(1e-10)
    expect(logIntegralAdaptive(() => -Infinity, [0, 1], 1e-12, 50)).toBe(-Infinity)
  })
})
