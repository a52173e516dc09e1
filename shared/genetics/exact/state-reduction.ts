import type { TransitionBand } from './transition-band'

/**
 * Subtraction-free state reduction (Grassmann, Taksar & Heyman 1985) of the
 * transient block of an absorbing chain stored as a `TransitionBand`.
 *
 * States 1, 2, …, n−1 are eliminated in increasing order. Eliminating k
 * replaces the chain by the chain watched only outside k ("censored"):
 *   P_ij += P_ik · P_kj / S_k   for every remaining i with P_ik > 0 and j,
 * where the pivot S_k is the *sum of k's outgoing probabilities* to the
 * remaining states and to the absorbing states 0 and n — never 1 − P_kk.
 * Only positive numbers are added, multiplied and divided, so every result
 * keeps full relative precision, however small (a probability of 10⁻³⁰⁰ is
 * as accurate as one of 0.5). The band is overwritten in place: afterwards
 * row k holds the censored row of k (columns > k) and column k below the
 * diagonal holds the multipliers P_ik, as in an LU factorisation, so any
 * right-hand side can be solved afterwards (`solveReduced`).
 *
 * Cost: Σ_k (rows reaching k) × (columns of row k above k), i.e. about
 * n × (lower width) × (upper width) multiply–adds, i.e. O(n²) since both
 * widths grow as √n: 2.4·10⁸ at 2N = 2000 with the full cutoffs, 9% of a
 * dense elimination (n³/3), and the share falls as 1/n.
 * Because lowColumn and highColumn are non-decreasing, fill stays in the
 * profile. Reference: Grassmann WK, Taksar MI, Heyman DP (1985) Regenerative
 * analysis and steady state distributions for Markov chains. Operations
 * Research 33:1107–1116.
 *
 * @returns the pivots S_k (index k = 1..n−1), scaled like the band
 */
export function reduceStates(band: TransitionBand): Float64Array {
  const { geneCopies: n, rowStart, lowColumn, highColumn, entries, toLoss, toFixation } = band
  const pivot = new Float64Array(n + 1)
  // Row i's column j lives at entries[rowBase(i) + j].
  const rowBase = (i: number): number => (rowStart[i] ?? 0) - (lowColumn[i] ?? 0)
  let lastRow = 0
  for (let k = 1; k < n; k++) {
    const baseK = rowBase(k)
    const first = Math.max(k + 1, lowColumn[k] ?? 0)
    const last = highColumn[k] ?? 0
    const lossK = toLoss[k] ?? 0
    const fixationK = toFixation[k] ?? 0
    let outgoing = lossK + fixationK
    for (let j = first; j <= last; j++) outgoing += entries[baseK + j] ?? 0
    if (!(outgoing > 0)) throw new Error(`reduceStates: state ${k} has no outgoing probability left`)
    pivot[k] = outgoing
    while (lastRow + 1 < n && (lowColumn[lastRow + 1] ?? n) <= k) lastRow++
    // Multipliers P_ik / S_k for the rows that can jump to k; the absorbing
    // columns are updated here, the band columns in the loops below.
    const multiplierOf = (i: number): number => {
      const multiplier = (entries[rowBase(i) + k] ?? 0) / outgoing
      toLoss[i] = (toLoss[i] ?? 0) + multiplier * lossK
      toFixation[i] = (toFixation[i] ?? 0) + multiplier * fixationK
      return multiplier
    }
    let i = k + 1
    // Eight rows per sweep share each load of row k: about 2× faster in V8
    // than one row at a time (the loop is bound by memory traffic).
    for (; i + 7 <= lastRow; i += 8) {
      const base0 = rowBase(i)
      const base1 = rowBase(i + 1)
      const base2 = rowBase(i + 2)
      const base3 = rowBase(i + 3)
      const base4 = rowBase(i + 4)
      const base5 = rowBase(i + 5)
      const base6 = rowBase(i + 6)
      const base7 = rowBase(i + 7)
      const multiplier0 = multiplierOf(i)
      const multiplier1 = multiplierOf(i + 1)
      const multiplier2 = multiplierOf(i + 2)
      const multiplier3 = multiplierOf(i + 3)
      const multiplier4 = multiplierOf(i + 4)
      const multiplier5 = multiplierOf(i + 5)
      const multiplier6 = multiplierOf(i + 6)
      const multiplier7 = multiplierOf(i + 7)
      for (let j = first; j <= last; j++) {
        const fromK = entries[baseK + j] ?? 0
        entries[base0 + j] = (entries[base0 + j] ?? 0) + multiplier0 * fromK
        entries[base1 + j] = (entries[base1 + j] ?? 0) + multiplier1 * fromK
        entries[base2 + j] = (entries[base2 + j] ?? 0) + multiplier2 * fromK
        entries[base3 + j] = (entries[base3 + j] ?? 0) + multiplier3 * fromK
        entries[base4 + j] = (entries[base4 + j] ?? 0) + multiplier4 * fromK
        entries[base5 + j] = (entries[base5 + j] ?? 0) + multiplier5 * fromK
        entries[base6 + j] = (entries[base6 + j] ?? 0) + multiplier6 * fromK
        entries[base7 + j] = (entries[base7 + j] ?? 0) + multiplier7 * fromK
      }
    }
    for (; i <= lastRow; i++) {
      const baseI = rowBase(i)
      const multiplier = multiplierOf(i)
      if (multiplier === 0) continue
      for (let j = first; j <= last; j++) {
        entries[baseI + j] = (entries[baseI + j] ?? 0) + multiplier * (entries[baseK + j] ?? 0)
      }
    }
  }
  return pivot
}

/**
 * Solves (I − Q)·x = r after `reduceStates`, for a right-hand side r on the
 * transient states (index 1..n−1; r ≥ 0), plus `absorbingWeight` times the
 * censored probability of jumping to state n (1 gives fixation
 * probabilities, 0 a pure reward problem). Both passes only add positive
 * terms. `rightHandSide` must be scaled like the band; it is overwritten.
 *
 * Forward: r_i += P_ik · r_k / S_k for k ascending (reward collected while
 * passing through eliminated states). Backward: x_k = (r_k + w·P_kn + Σ_{j>k}
 * P_kj·x_j) / S_k for k descending. Cost O(n × width).
 *
 * @returns x on states 0..n (x_0 = 0, x_n = absorbingWeight), unscaled
 */
export function solveReduced(
  band: TransitionBand, pivot: Float64Array, rightHandSide: Float64Array, absorbingWeight: number,
): Float64Array {
  const { geneCopies: n, rowStart, lowColumn, highColumn, entries, toFixation } = band
  let lastRow = 0
  for (let k = 1; k < n; k++) {
    while (lastRow + 1 < n && (lowColumn[lastRow + 1] ?? n) <= k) lastRow++
    const reward = rightHandSide[k] ?? 0
    if (reward === 0) continue
    const share = reward / (pivot[k] ?? 1)
    for (let i = k + 1; i <= lastRow; i++) {
      const into = entries[(rowStart[i] ?? 0) - (lowColumn[i] ?? 0) + k] ?? 0
      rightHandSide[i] = (rightHandSide[i] ?? 0) + into * share
    }
  }
  const solution = new Float64Array(n + 1)
  solution[n] = absorbingWeight
  for (let k = n - 1; k >= 1; k--) {
    const lowK = lowColumn[k] ?? 0
    const baseK = (rowStart[k] ?? 0) - lowK
    let sum = (rightHandSide[k] ?? 0) + absorbingWeight * (toFixation[k] ?? 0)
    for (let j = Math.max(k + 1, lowK); j <= (highColumn[k] ?? 0); j++) {
      sum += (entries[baseK + j] ?? 0) * (solution[j] ?? 0)
    }
    solution[k] = sum / (pivot[k] ?? 1)
  }
  return solution
}
