import { compareAlleles } from './allele-order'
import type { GenotypeDataset } from './types'

/**
 * Counts at one locus of one population sample: the sufficient statistics
 * for every summary in this folder. Missing genotypes are left out, so
 * `sampleSize` is the number of individuals genotyped at this locus.
 */
export interface LocusTally {
  locus: string
  /** n: individuals with a genotype at this locus */
  sampleSize: number
  /** individuals whose two alleles differ */
  heterozygotes: number
  /** distinct alleles seen, in `compareAlleles` order */
  alleles: string[]
  /** copies of each allele (aligned with `alleles`); sums to 2n */
  copies: number[]
  /** heterozygous individuals carrying each allele (aligned with `alleles`) */
  heterozygousCarriers: number[]
}

interface AlleleCounter {
  copies: number
  heterozygousCarriers: number
}

function countAllele(counters: Map<string, AlleleCounter>, allele: string, heterozygous: boolean): void {
  let counter = counters.get(allele)
  if (!counter) {
    counter = { copies: 0, heterozygousCarriers: 0 }
    counters.set(allele, counter)
  }
  counter.copies += 1
  if (heterozygous) counter.heterozygousCarriers += 1
}

/**
 * Tallies every locus of a (validated) dataset, in the dataset's locus order.
 * Walks the data row by row (each individual's genotype list in memory
 * order). O(individuals · loci + alleles · log alleles).
 */
export function tallyLoci(dataset: GenotypeDataset): LocusTally[] {
  const locusCount = dataset.loci.length
  const counters = dataset.loci.map(() => new Map<string, AlleleCounter>())
  const sampleSizes = new Array<number>(locusCount).fill(0)
  const heterozygoteCounts = new Array<number>(locusCount).fill(0)
  for (const individual of dataset.individuals) {
    const genotypes = individual.genotypes
    for (let locusIndex = 0; locusIndex < locusCount; locusIndex++) {
      const genotype = genotypes[locusIndex]
      const locusCounters = counters[locusIndex]
      if (!genotype || !locusCounters) continue
      const [first, second] = genotype
      const heterozygous = first !== second
      sampleSizes[locusIndex] = (sampleSizes[locusIndex] ?? 0) + 1
      if (heterozygous) heterozygoteCounts[locusIndex] = (heterozygoteCounts[locusIndex] ?? 0) + 1
      countAllele(locusCounters, first, heterozygous)
      countAllele(locusCounters, second, heterozygous)
    }
  }
  return dataset.loci.map((locus, locusIndex) => {
    const locusCounters = counters[locusIndex] ?? new Map<string, AlleleCounter>()
    const alleles = [...locusCounters.keys()].sort(compareAlleles)
    const copies: number[] = []
    const heterozygousCarriers: number[] = []
    for (const allele of alleles) {
      const counter = locusCounters.get(allele)
      copies.push(counter?.copies ?? 0)
      heterozygousCarriers.push(counter?.heterozygousCarriers ?? 0)
    }
    return {
      locus,
      sampleSize: sampleSizes[locusIndex] ?? 0,
      heterozygotes: heterozygoteCounts[locusIndex] ?? 0,
      alleles,
      copies,
      heterozygousCarriers,
    }
  })
}

/** Σ copies² at a locus, exact in integers while 2n < 9.4·10⁷. */
export function sumOfSquaredCopies(tally: LocusTally): number {
  let sum = 0
  for (const count of tally.copies) sum += count * count
  return sum
}
