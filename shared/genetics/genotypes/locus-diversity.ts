import { type LocusTally, sumOfSquaredCopies } from './locus-tally'

/** Diversity at one locus of one population sample (SCIENCE.md §8.1). */
export interface LocusDiversity {
  locus: string
  /** n: individuals genotyped at this locus (missing genotypes left out) */
  sampleSize: number
  /** 2n: gene copies sampled */
  geneCount: number
  /** number of distinct alleles observed */
  alleleCount: number
  /** copies of each allele, alleles in numeric-then-text order */
  alleleCounts: { allele: string, count: number }[]
  /** exactly one allele observed */
  monomorphic: boolean
  /** Ho = heterozygous individuals / n; null when n = 0 */
  observedHeterozygosity: number | null
  /** Nei (1978) unbiased He = 2n/(2n − 1) · (1 − Σp²); null when n = 0 */
  expectedHeterozygosity: number | null
  /** plug-in He = 1 − Σp²; null when n = 0 */
  expectedHeterozygosityPlugIn: number | null
  /** Nei (1987) Hs = 2n/(2n − 1) · (1 − Σp² − Ho/(2n)); null when n = 0 */
  expectedHeterozygosityNei1987: number | null
  /** F_IS = 1 − Ho/He (Nei 1978 He); null when He = 0 (monomorphic) or n = 0 */
  inbreedingCoefficient: number | null
}

/**
 * Heterozygosities and F_IS at one locus from its allele counts.
 *
 * Numerical care: with G = 2n gene copies and D = G² − Σcᵢ² (cᵢ = copies of
 * allele i), every quantity is one division of exact integers, so each
 * result is the correctly rounded value of the exact fraction:
 *   plug-in He = D / G²,   Nei 1978 He = D / (G(G − 1)),
 *   Nei 1987 Hs = (D − 2·het) / (G(G − 1)),   F_IS = (D − 2·het·(G − 1)) / D.
 * Integers stay exact while G < 9.4·10⁷ gene copies.
 */
export function locusDiversity(tally: LocusTally): LocusDiversity {
  const sampleSize = tally.sampleSize
  const geneCount = 2 * sampleSize
  const alleleCounts = tally.alleles.map((allele, index) => ({ allele, count: tally.copies[index] ?? 0 }))
  const base = {
    locus: tally.locus,
    sampleSize,
    geneCount,
    alleleCount: tally.alleles.length,
    alleleCounts,
    monomorphic: tally.alleles.length === 1,
  }
  if (sampleSize === 0) {
    return {
      ...base,
      observedHeterozygosity: null,
      expectedHeterozygosity: null,
      expectedHeterozygosityPlugIn: null,
      expectedHeterozygosityNei1987: null,
      inbreedingCoefficient: null,
    }
  }
  const heterozygotes = tally.heterozygotes
  const differingPairs = geneCount * geneCount - sumOfSquaredCopies(tally) // D
  const orderedPairs = geneCount * (geneCount - 1)
  return {
    ...base,
    observedHeterozygosity: heterozygotes / sampleSize,
    expectedHeterozygosity: differingPairs / orderedPairs,
    expectedHeterozygosityPlugIn: differingPairs / (geneCount * geneCount),
    expectedHeterozygosityNei1987: (differingPairs - 2 * heterozygotes) / orderedPairs,
    inbreedingCoefficient: differingPairs === 0
      ? null
      : (differingPairs - 2 * heterozygotes * (geneCount - 1)) / differingPairs,
  }
}
