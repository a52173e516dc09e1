import { domainError, requireInteger } from '../validate'
import { tallyLoci } from './locus-tally'
import { rarefiedAlleleCount } from './rarefaction'
import type { GenotypeDataset } from './types'
import { requireValidGenotypeDataset } from './validate-dataset'

/** Allelic richness at one locus. */
export interface LocusAllelicRichness {
  locus: string
  /** 2n: gene copies sampled at this locus */
  geneCount: number
  /** alleles observed in the full sample */
  alleleCount: number
  /** A(g): expected alleles in g gene copies */
  richness: number
}

/** Result of `allelicRichness`. */
export interface AllelicRichnessResult {
  /** g, gene copies */
  rarefactionSize: number
  /** always true: every locus is averaged, monomorphic ones contribute 1 */
  includesMonomorphicLoci: true
  loci: LocusAllelicRichness[]
  /** mean of A(g) over loci */
  meanRichness: number
  /** mean observed allele count over loci (not rarefied) */
  meanAlleleCount: number
}

/**
 * Smallest number of gene copies (2 × genotyped individuals) at any locus of
 * a dataset, with the locus where it occurs: the largest valid rarefaction
 * size for `allelicRichness`. To compare populations, rarefy all of them to
 * the minimum of this value over the populations.
 *
 * @param dataset - one population sample
 * @returns `{ geneCount, locus }`; geneCount 0 if a locus has no genotyped individual
 * @throws RangeError if the dataset is not valid
 * @example smallestGeneCount(alderHollow)  // { geneCount: 12, locus: 'Loc1' } (SCIENCE.md §8.2)
 */
export function smallestGeneCount(dataset: GenotypeDataset): { geneCount: number, locus: string } {
  requireValidGenotypeDataset('smallestGeneCount', 'dataset', dataset)
  return smallestOf(tallyLoci(dataset).map(tally => ({ geneCount: 2 * tally.sampleSize, locus: tally.locus })))
}

function smallestOf(loci: { geneCount: number, locus: string }[]): { geneCount: number, locus: string } {
  let smallest = loci[0] ?? { geneCount: 0, locus: '' }
  for (const locus of loci) if (locus.geneCount < smallest.geneCount) smallest = locus
  return smallest
}

/**
 * Allelic richness by rarefaction: the expected number of distinct alleles
 * at each locus in a random subsample of g gene copies, so that populations
 * sampled with different effort can be compared.
 *
 * Why: the raw allele count grows with sample size; rescue planning compares
 * richness between small and large samples (SCIENCE.md §8).
 *
 * Formula (Hurlbert 1971; applied to alleles by El Mousadik & Petit 1996),
 * with G = 2n gene copies at the locus, cᵢ copies of allele i:
 *   A(g) = Σᵢ [1 − C(G − cᵢ, g) / C(G, g)],   C(a, g) = 0 when a < g,
 * evaluated as a stable hypergeometric product in log space (see
 * `rarefaction.ts`); A(G) equals the observed allele count exactly.
 * Assumptions: gene copies are a random sample; missing genotypes are left
 * out per locus. Mean over all loci; monomorphic loci count (A = 1).
 * References: Hurlbert, S. H. (1971). The nonconcept of species diversity:
 *   a critique and alternative parameters. Ecology 52: 577–586.
 *   El Mousadik, A., Petit, R. J. (1996). High level of genetic
 *   differentiation for allelic richness among populations of the argan
 *   tree. Theoretical and Applied Genetics 92: 832–839.
 *
 * @param dataset - one population sample
 * @param rarefactionSize - g, gene copies, integer in [1, smallest per-locus gene count];
 *   usually the smallest gene count over all populations being compared
 * @returns per-locus A(g) in dataset order and their mean
 * @throws RangeError if g is not an integer ≥ 1, exceeds the smallest per-locus
 *   gene count (a locus with no genotyped individual has 0), or the dataset is invalid
 * @example allelicRichness(cinderFlats, 12).loci[0].richness  // 2.75 (SCIENCE.md §8.3, CF Loc1)
 * @example allelicRichness(cinderFlats, 6).loci[2].richness   // 2.59527972027972 (CF Loc3)
 * @example allelicRichness(cinderFlats, 16).loci[0].richness  // 3 (full sample = observed count)
 * @example allelicRichness(cinderFlats, 1).meanRichness       // 1 (one gene copy shows one allele)
 * @example allelicRichness(cinderFlats, 17)  // RangeError: allelicRichness: rarefactionSize must be
 *   //  ≤ 16, the smallest per-locus gene count (locus "Loc1"), got 17
 */
export function allelicRichness(dataset: GenotypeDataset, rarefactionSize: number): AllelicRichnessResult {
  const fn = 'allelicRichness'
  requireValidGenotypeDataset(fn, 'dataset', dataset)
  requireInteger(fn, 'rarefactionSize', rarefactionSize, 1)
  const tallies = tallyLoci(dataset)
  const smallest = smallestOf(tallies.map(tally => ({ geneCount: 2 * tally.sampleSize, locus: tally.locus })))
  if (rarefactionSize > smallest.geneCount) {
    domainError(fn, 'rarefactionSize', `≤ ${smallest.geneCount}, the smallest per-locus gene count (locus "${smallest.locus}")`, rarefactionSize)
  }
  const loci = tallies.map(tally => ({
    locus: tally.locus,
    geneCount: 2 * tally.sampleSize,
    alleleCount: tally.alleles.length,
    richness: rarefiedAlleleCount(tally.copies, rarefactionSize),
  }))
  let sumRichness = 0
  let sumAlleles = 0
  for (const locus of loci) {
    sumRichness += locus.richness
    sumAlleles += locus.alleleCount
  }
  return {
    rarefactionSize,
    includesMonomorphicLoci: true,
    loci,
    meanRichness: sumRichness / loci.length,
    meanAlleleCount: sumAlleles / loci.length,
  }
}
