import { domainError } from '../validate'
import { tallyLoci, type LocusTally } from './locus-tally'
import type { GenotypeDataset } from './types'
import { requireValidGenotypeDataset } from './validate-dataset'

/** Alleles found in one population and in none of the others. */
export interface PrivateAlleleList {
  count: number
  alleles: { locus: string, allele: string }[]
}

/** Result of `privateAlleles`. */
export interface PrivateAlleleSummary {
  /** loci named in every dataset and genotyped in every population (first dataset's order) */
  sharedLoci: string[]
  /** loci named in every dataset but with no genotyped individual in some population */
  skippedLoci: string[]
  /** keyed by population name, same keys as the input */
  populations: Record<string, PrivateAlleleList>
}

/**
 * Private alleles: for each population, the alleles observed there and in no
 * other population, counted over the loci every population shares.
 *
 * Why: private alleles flag distinct genetic variation a source population
 * would bring to a recipient (and variation that would be lost if a
 * population died out).
 *
 * Rule: loci are matched by name; a locus counts only if every dataset names
 * it and every population has at least one genotyped individual there (with
 * no data, absence of an allele is unknown, so the locus is reported in
 * `skippedLoci`). Alleles match by exact label. The count depends on sample
 * sizes (larger samples find more rare alleles); compare populations of
 * similar sample size or rarefy.
 * Reference: Slatkin, M. (1985). Rare alleles as indicators of gene flow.
 *   Evolution 39: 53–65 [from memory].
 *
 * @param datasets - population name → dataset; at least two populations
 * @returns shared loci and, per population, the count and list of private alleles
 *   (loci in shared-locus order, alleles in numeric-then-text order)
 * @throws RangeError with fewer than two populations or an invalid dataset
 * @example privateAlleles({ 'Alder Hollow': alderHollow, 'Cinder Flats': cinderFlats })
 *   // SCIENCE.md §8.2: { sharedLoci: ['Loc1', 'Loc2', 'Loc3'], skippedLoci: [], populations: {
 *   //   'Alder Hollow': { count: 1, alleles: [{ locus: 'Loc3', allele: '150' }] },
 *   //   'Cinder Flats': { count: 1, alleles: [{ locus: 'Loc3', allele: '162' }] } } }
 */
export function privateAlleles(datasets: Record<string, GenotypeDataset>): PrivateAlleleSummary {
  const fn = 'privateAlleles'
  const names = Object.keys(datasets)
  if (names.length < 2) domainError(fn, 'datasets', 'at least two populations', names.length)
  const tallies = new Map<string, Map<string, LocusTally>>()
  for (const name of names) {
    const dataset = datasets[name] as GenotypeDataset // key comes from Object.keys
    requireValidGenotypeDataset(fn, `datasets["${name}"]`, dataset)
    tallies.set(name, new Map(tallyLoci(dataset).map(tally => [tally.locus, tally])))
  }
  const talliesOf = (locus: string): LocusTally[] =>
    names.map(name => tallies.get(name)?.get(locus)).filter((tally): tally is LocusTally => tally !== undefined)

  const firstLoci = datasets[names[0] as string]?.loci ?? []
  const named = firstLoci.filter(locus => talliesOf(locus).length === names.length)
  const sharedLoci = named.filter(locus => talliesOf(locus).every(tally => tally.sampleSize > 0))
  const skippedLoci = named.filter(locus => !sharedLoci.includes(locus))

  const populations: Record<string, PrivateAlleleList> = {}
  for (const name of names) populations[name] = { count: 0, alleles: [] }
  for (const locus of sharedLoci) {
    const locusTallies = talliesOf(locus)
    const seenIn = new Map<string, number>()
    for (const tally of locusTallies) {
      for (const allele of tally.alleles) seenIn.set(allele, (seenIn.get(allele) ?? 0) + 1)
    }
    locusTallies.forEach((tally, index) => {
      const list = populations[names[index] as string]
      if (!list) return
      for (const allele of tally.alleles) {
        if (seenIn.get(allele) === 1) list.alleles.push({ locus, allele })
      }
      list.count = list.alleles.length
    })
  }
  return { sharedLoci, skippedLoci, populations }
}
