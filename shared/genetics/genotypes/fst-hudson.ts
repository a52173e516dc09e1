import { type LocusTally, sumOfSquaredCopies } from './locus-tally'

/** Hudson F_ST terms at one locus. */
export interface HudsonLocusFst {
  locus: string
  /** H_w: mean over the two populations of the probability that two distinct gene copies from one population differ */
  withinPopulationDiversity: number
  /** H_b: probability that one gene copy from each population differ */
  betweenPopulationDiversity: number
  /** 1 − H_w/H_b; null when H_b = 0 (both populations fixed for the same allele) */
  fst: number | null
}

/** Σ_i c1ᵢ·c2ᵢ over alleles present in both tallies (both sorted the same way). */
function sharedCopyProducts(first: LocusTally, second: LocusTally): number {
  const secondCopies = new Map<string, number>()
  second.alleles.forEach((allele, index) => secondCopies.set(allele, second.copies[index] ?? 0))
  let sum = 0
  first.alleles.forEach((allele, index) => {
    sum += (first.copies[index] ?? 0) * (secondCopies.get(allele) ?? 0)
  })
  return sum
}

/** Probability that two distinct gene copies of one sample differ: D/(G(G − 1)), G ≥ 2. */
function withinSampleDiversity(tally: LocusTally): number {
  const geneCount = 2 * tally.sampleSize
  return (geneCount * geneCount - sumOfSquaredCopies(tally)) / (geneCount * (geneCount - 1))
}

/**
 * Hudson et al. (1992) terms at one locus, both populations genotyped
 * (n ≥ 1 each). Exact integer numerators and denominators, one division each:
 *   H_w = ½·[D₁/(G₁(G₁ − 1)) + D₂/(G₂(G₂ − 1))],  Dₖ = Gₖ² − Σcₖᵢ²,
 *   H_b = (G₁G₂ − Σc₁ᵢc₂ᵢ)/(G₁G₂).
 * Floating-point addition and multiplication are commutative and the integer
 * sums are exact, so swapping the two populations gives bit-identical terms.
 */
export function hudsonLocusFst(first: LocusTally, second: LocusTally): HudsonLocusFst {
  const withinFirst = withinSampleDiversity(first)
  const withinSecond = withinSampleDiversity(second)
  const withinPopulationDiversity = (withinFirst + withinSecond) / 2
  const geneProduct = 4 * first.sampleSize * second.sampleSize
  const betweenPopulationDiversity = (geneProduct - sharedCopyProducts(first, second)) / geneProduct
  return {
    locus: first.locus,
    withinPopulationDiversity,
    betweenPopulationDiversity,
    fst: betweenPopulationDiversity === 0 ? null : 1 - withinPopulationDiversity / betweenPopulationDiversity,
  }
}
