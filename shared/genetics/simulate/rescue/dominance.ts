import { domainError, requireInRange, requirePositive } from '../../validate'

/**
 * Rate k of the dominance–selection relation h(s) = exp(−k·s)/2 that gives a
 * chosen mean dominance when s follows a gamma distribution.
 *
 * Why: strongly harmful mutations tend to be more recessive than mild ones.
 * The relation h = exp(−k·s)/2 is the form used by Deng & Lynch (1996,
 * Genetics 144:349–360) [memory]; Agrawal & Whitlock (2011, Genetics
 * 187:553–566) review the empirical inverse relation between h and s
 * [memory]. h → ½ (additive) as s → 0 and falls towards 0 for lethals.
 *
 * Formula: for s ~ Gamma(shape β, mean s̄) (scale θ = s̄/β),
 * E[exp(−k·s)] = (1 + k·θ)^(−β), so E[h] = h̄ gives
 * k = ((2h̄)^(−1/β) − 1)/θ. (Selection coefficients capped at 1 by the
 * simulation make the realised mean h very slightly larger.)
 *
 * @param meanDominance - h̄, in (0, 0.5]
 * @param meanSelection - s̄, mean of the gamma distribution, > 0
 * @param selectionShape - β, gamma shape, > 0
 * @returns k ≥ 0 (0 when h̄ = ½: every mutation additive)
 * @throws RangeError if an argument is outside its domain
 * @example dominanceRate(0.5, 0.05, 0.3) // 0
 * @example dominanceRate(0.25, 0.1, 1)   // 10  (h̄ = ½·(1 + 0.1k)⁻¹ = ¼)
 * @example dominanceRate(0.2, 0.05, 0.3) // 121.238…
 */
export function dominanceRate(meanDominance: number, meanSelection: number, selectionShape: number): number {
  const fn = 'dominanceRate'
  requireInRange(fn, 'meanDominance', meanDominance, 0, 0.5)
  if (meanDominance === 0) domainError(fn, 'meanDominance', 'in (0, 0.5]', meanDominance)
  requirePositive(fn, 'meanSelection', meanSelection)
  requirePositive(fn, 'selectionShape', selectionShape)
  const scale = meanSelection / selectionShape
  return (Math.pow(2 * meanDominance, -1 / selectionShape) - 1) / scale
}

/**
 * Dominance of a harmful mutation from its selection coefficient,
 * h = exp(−k·s)/2 (see `dominanceRate`).
 *
 * @param selection - s, in [0, 1]
 * @param rate - k ≥ 0
 * @returns h in (0, ½]
 * @example dominanceFromSelection(0, 124) // 0.5
 * @example dominanceFromSelection(1, 10)  // 0.0000227
 */
export function dominanceFromSelection(selection: number, rate: number): number {
  return Math.exp(-rate * selection) / 2
}
