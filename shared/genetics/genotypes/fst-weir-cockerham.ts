import { compareAlleles } from './allele-order'
import type { LocusTally } from './locus-tally'

/** Weir & Cockerham (1984) variance components at one locus, summed over alleles. */
export interface WeirCockerhamLocusFst {
  locus: string
  /** a: among populations */
  amongPopulations: number
  /** b: among individuals within populations */
  amongIndividuals: number
  /** c: between gene copies within individuals */
  withinIndividuals: number
  /** θ = a/(a + b + c); null when a + b + c = 0 (monomorphic in both) */
  fst: number | null
}

interface AlleleCounts {
  copies: number
  heterozygousCarriers: number
}

function countsByAllele(tally: LocusTally): Map<string, AlleleCounts> {
  const counts = new Map<string, AlleleCounts>()
  tally.alleles.forEach((allele, index) => counts.set(allele, {
    copies: tally.copies[index] ?? 0,
    heterozygousCarriers: tally.heterozygousCarriers[index] ?? 0,
  }))
  return counts
}

/**
 * Weir & Cockerham (1984) components for r = 2 populations at one locus
 * (SCIENCE.md §8.1). Caller guarantees n₁, n₂ ≥ 1 and n₁ + n₂ ≥ 3 (n̄ > 1).
 * With n̄ = (n₁ + n₂)/2, n_c = n₁ + n₂ − (n₁² + n₂²)/(n₁ + n₂), and for
 * each allele p̄ = Σnᵢpᵢ/Σnᵢ, s² = Σnᵢ(pᵢ − p̄)²/n̄, h̄ = Σnᵢhᵢ/Σnᵢ:
 *   a = (n̄/n_c)·{s² − [p̄(1 − p̄) − s²/2 − h̄/4]/(n̄ − 1)}
 *   b = [n̄/(n̄ − 1)]·[p̄(1 − p̄) − s²/2 − (2n̄ − 1)h̄/(4n̄)]
 *   c = h̄/2
 * Alleles are visited in `compareAlleles` order and every two-population sum
 * is a single commutative addition, so swapping the populations gives
 * bit-identical components.
 */
export function weirCockerhamLocusFst(first: LocusTally, second: LocusTally): WeirCockerhamLocusFst {
  const firstCounts = countsByAllele(first)
  const secondCounts = countsByAllele(second)
  const alleles = [...new Set([...first.alleles, ...second.alleles])].sort(compareAlleles)
  const firstSize = first.sampleSize
  const secondSize = second.sampleSize
  const totalSize = firstSize + secondSize
  const meanSize = totalSize / 2 // n̄
  const sizeVariationTerm = totalSize - (firstSize * firstSize + secondSize * secondSize) / totalSize // n_c (r − 1 = 1)

  let amongPopulations = 0
  let amongIndividuals = 0
  let withinIndividuals = 0
  for (const allele of alleles) {
    const one = firstCounts.get(allele) ?? { copies: 0, heterozygousCarriers: 0 }
    const two = secondCounts.get(allele) ?? { copies: 0, heterozygousCarriers: 0 }
    const firstFrequency = one.copies / (2 * firstSize)
    const secondFrequency = two.copies / (2 * secondSize)
    const meanFrequency = (one.copies + two.copies) / (2 * totalSize) // p̄
    const frequencyVariance = (firstSize * (firstFrequency - meanFrequency) ** 2
      + secondSize * (secondFrequency - meanFrequency) ** 2) / meanSize // s²
    const meanHeterozygosity = (one.heterozygousCarriers + two.heterozygousCarriers) / totalSize // h̄
    const binomialVariance = meanFrequency * (1 - meanFrequency) // p̄(1 − p̄)
    amongPopulations += (meanSize / sizeVariationTerm) * (frequencyVariance
      - (binomialVariance - frequencyVariance / 2 - meanHeterozygosity / 4) / (meanSize - 1))
    amongIndividuals += (meanSize / (meanSize - 1)) * (binomialVariance - frequencyVariance / 2
      - ((2 * meanSize - 1) * meanHeterozygosity) / (4 * meanSize))
    withinIndividuals += meanHeterozygosity / 2
  }
  const total = amongPopulations + amongIndividuals + withinIndividuals
  return {
    locus: first.locus,
    amongPopulations,
    amongIndividuals,
    withinIndividuals,
    fst: total === 0 ? null : amongPopulations / total,
  }
}
