/**
 * Frequency of A among survivors after one round of viability selection on
 * zygotes formed by random union of gametes (SCIENCE.md §2.1, eq. 2.1).
 *
 * Formula: p′ = p·[1 + s(p + h·q)] / w̄, w̄ = 1 + s·p² + 2hs·p·q, q = 1 − p.
 * Assumptions: fitnesses 1+s : 1+hs : 1 for AA : Aa : aa; Hardy–Weinberg
 * zygote proportions; no mutation.
 *
 * @param frequency - p, in [0, 1] (not checked: inner loop)
 * @param s - selection coefficient, 1 + s > 0
 * @param h - dominance, 1 + hs > 0
 * @returns p′ in [0, 1]; p′ = p at p ∈ {0, 1} and when s = 0
 * @example frequencyAfterSelection(0.5, 0.1, 0.5) // 0.511904761904762
 * @example frequencyAfterSelection(0, 0.5, 1)     // 0
 * @example frequencyAfterSelection(0.3, 0, 0.5)   // 0.3
 */
export function frequencyAfterSelection(frequency: number, s: number, h: number): number {
  const other = 1 - frequency
  const meanFitness = 1 + s * frequency * frequency + 2 * h * s * frequency * other
  return frequency * (1 + s * (frequency + h * other)) / meanFitness
}
