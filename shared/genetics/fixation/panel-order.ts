/**
 * Chooses how many Gauss–Legendre points a panel needs (internal).
 *
 * A panel integrates exp(−E) where the exponent E is a quadratic that changes
 * monotonically by `variation` across the panel. The table below holds the
 * largest relative error of the n-point rule over every such shape
 * (E(τ) = α·τ + γ·τ² on τ ∈ [0, 1], monotone, α + γ = variation), measured
 * once against a 100-point rule and rounded up; it is an empirical property of
 * the rules, not of any input. The 10⁻¹⁵ floor is double-precision rounding.
 */

/** Panel variations (change of the exponent across the panel) that index the table. */
const VARIATION_BUCKETS = [1e-4, 1e-3, 0.01, 0.05, 0.1, 0.25, 0.5, 1, 2, 3, 4, 6, 8, 12, 16, 20, 24, 32]

/** Orders tried, from cheapest to most expensive. */
export const PANEL_ORDERS = [2, 3, 4, 5, 6, 7, 8, 10, 12, 14, 16, 20, 24] as const

/** Worst relative error: one row per variation bucket, one column per order. */
const WORST_RELATIVE_ERROR: readonly (readonly number[])[] = [
  [3e-11, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [3e-9, 6e-14, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [3e-7, 6e-11, 1e-14, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [7e-6, 8e-9, 7e-12, 5e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [3e-5, 7e-8, 1e-10, 2e-13, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [2e-4, 1e-6, 6e-9, 2e-11, 6e-14, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [1e-3, 1e-5, 1e-7, 9e-10, 6e-12, 3e-14, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [6e-3, 2e-4, 3e-6, 5e-8, 7e-10, 7e-12, 7e-14, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [4e-2, 2e-3, 1e-4, 4e-6, 1e-7, 2e-9, 5e-11, 1e-14, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [1e-1, 1e-2, 8e-4, 4e-5, 2e-6, 7e-8, 2e-9, 2e-12, 1e-15, 1e-15, 1e-15, 1e-15, 1e-15],
  [2e-1, 3e-2, 3e-3, 2e-4, 2e-5, 8e-7, 4e-8, 5e-11, 4e-14, 1e-15, 1e-15, 2e-15, 1e-15],
  [4e-1, 1e-1, 2e-2, 2e-3, 2e-4, 2e-5, 1e-6, 5e-9, 1e-11, 1e-14, 1e-15, 2e-15, 2e-15],
  [6e-1, 2e-1, 6e-2, 1e-2, 1e-3, 2e-4, 2e-5, 1e-7, 5e-10, 1e-12, 2e-15, 3e-15, 2e-15],
  [9e-1, 5e-1, 2e-1, 6e-2, 1e-2, 2e-3, 4e-4, 7e-6, 7e-8, 5e-10, 3e-12, 5e-15, 4e-15],
  [1, 7e-1, 4e-1, 1e-1, 4e-2, 1e-2, 3e-3, 9e-5, 2e-6, 3e-8, 3e-10, 8e-15, 5e-15],
  [1, 8e-1, 5e-1, 3e-1, 1e-1, 3e-2, 9e-3, 5e-4, 2e-5, 4e-7, 8e-9, 1e-12, 6e-15],
  [1, 9e-1, 7e-1, 4e-1, 2e-1, 7e-2, 2e-2, 2e-3, 1e-4, 4e-6, 1e-7, 3e-11, 7e-15],
  [1, 1, 8e-1, 6e-1, 4e-1, 2e-1, 8e-2, 1e-2, 1e-3, 7e-5, 4e-6, 4e-9, 2e-12],
]

/**
 * Smallest tabulated order whose worst-case relative error on a panel of the
 * given exponent variation is within `tolerance` (the largest order when none is).
 *
 * @param variation - change of the exponent across the panel, ≥ 0 (≤ 32 expected)
 * @param tolerance - acceptable relative error of this panel's integral, > 0
 * @returns a Gauss–Legendre order from `PANEL_ORDERS`
 * @example panelOrder(1e-5, 1e-15)  // 3
 * @example panelOrder(8, 2e-15)     // 16
 */
export function panelOrder(variation: number, tolerance: number): number {
  let bucket = 0
  while (bucket < VARIATION_BUCKETS.length - 1 && (VARIATION_BUCKETS[bucket] ?? Infinity) < variation) bucket++
  const row = WORST_RELATIVE_ERROR[bucket] ?? []
  for (let column = 0; column < PANEL_ORDERS.length; column++) {
    if ((row[column] ?? 1) <= tolerance) return PANEL_ORDERS[column] ?? 24
  }
  return PANEL_ORDERS[PANEL_ORDERS.length - 1] ?? 24
}
