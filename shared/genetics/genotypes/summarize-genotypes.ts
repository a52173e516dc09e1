import { locusDiversity, type LocusDiversity } from './locus-diversity'
import { tallyLoci } from './locus-tally'
import type { GenotypeDataset } from './types'
import { requireValidGenotypeDataset } from './validate-dataset'

/** Multi-locus means over the loci listed in `lociInMeans` (SCIENCE.md §8.1). */
export interface MultilocusDiversity {
  /** rows in the dataset */
  individualCount: number
  /** individuals with at least one non-missing genotype */
  genotypedIndividualCount: number
  /** missing genotypes / (individuals · loci), in [0, 1] */
  missingGenotypeFraction: number
  /** loci averaged in the means below */
  lociInMeans: string[]
  /** loci left out because no individual was genotyped there */
  lociWithoutData: string[]
  /** loci with a single allele (left out of the means only if asked) */
  monomorphicLoci: string[]
  /** mean over loci of n (individuals genotyped) */
  meanSampleSize: number | null
  /** mean number of alleles per locus */
  meanAlleleCount: number | null
  meanObservedHeterozygosity: number | null
  /** mean Nei (1978) unbiased He */
  meanExpectedHeterozygosity: number | null
  meanExpectedHeterozygosityPlugIn: number | null
  meanExpectedHeterozygosityNei1987: number | null
  /** multi-locus F_IS = 1 − mean(Ho)/mean(He); null when mean He = 0 */
  inbreedingCoefficient: number | null
}

/** Result of `summarizeGenotypes`. */
export interface GenotypeSummary {
  /** which He the headline values use */
  expectedHeterozygosityEstimator: 'nei-1978-unbiased'
  /** whether monomorphic loci are included in the multi-locus means */
  includesMonomorphicLoci: boolean
  loci: LocusDiversity[]
  overall: MultilocusDiversity
}

function mean(values: readonly number[]): number | null {
  if (values.length === 0) return null
  let sum = 0
  for (const value of values) sum += value
  return sum / values.length
}

/**
 * Per-locus and multi-locus genetic diversity of one population sample:
 * sample size, number of alleles, observed heterozygosity Ho, expected
 * heterozygosity He (gene diversity) and the inbreeding coefficient F_IS.
 *
 * Why: these are the headline numbers a manager compares between source and
 * recipient populations before a translocation (low He, high F_IS = inbred).
 *
 * Formulas (SCIENCE.md §8.1), per locus with n individuals genotyped there
 * and allele frequencies pᵢ = copies/(2n):
 *   Ho = heterozygotes / n;  He (Nei 1978, the default) = 2n/(2n − 1)·(1 − Σpᵢ²);
 *   plug-in He = 1 − Σpᵢ²;  Nei 1987 Hs = 2n/(2n − 1)·(1 − Σpᵢ² − Ho/(2n));
 *   F_IS = 1 − Ho/He.
 * Multi-locus: arithmetic means over loci of n, allele count, Ho and each He;
 * F_IS = 1 − mean(Ho)/mean(He) (a ratio of means, not a mean of ratios).
 * Degenerate cases, never NaN: a locus with no genotyped individual has null
 * heterozygosities and is left out of the means (listed in
 * `lociWithoutData`); a monomorphic locus has He = 0 and F_IS = null; the
 * multi-locus F_IS is null when mean He = 0; every mean is null when no locus
 * is averaged.
 * Assumptions: diploid co-dominant markers; missing genotypes are missing at
 * random (each locus uses only the individuals genotyped there).
 * References: Nei, M. (1978). Estimation of average heterozygosity and
 *   genetic distance from a small number of individuals. Genetics 89: 583–590.
 *   Nei, M. (1987). Molecular Evolutionary Genetics. Columbia University Press.
 *
 * @param dataset - one population sample (see `validateGenotypeDataset`)
 * @param options.includeMonomorphicLoci - keep single-allele loci in the
 *   multi-locus means (default true; SCIENCE.md §8 asks to say which)
 * @returns per-locus `LocusDiversity` in dataset order and the multi-locus `overall`
 * @throws RangeError if the dataset is not valid
 * @example summarizeGenotypes(alderHollow).loci[1]
 *   // AH Loc2 of SCIENCE.md §8.2: { sampleSize: 6, alleleCount: 2,
 *   //   observedHeterozygosity: 0.3333333333333333, expectedHeterozygosity: 0.48484848484848486 (16/33),
 *   //   inbreedingCoefficient: 0.3125, ... }
 * @example summarizeGenotypes(alderHollow).overall.inbreedingCoefficient  // 0.16101694915254228 (19/118)
 * @example summarizeGenotypes({ loci: ['L'], individuals: [{ id: 'a', genotypes: [['1', '1']] }] }).loci[0]
 *   // { expectedHeterozygosity: 0, inbreedingCoefficient: null, monomorphic: true, ... }
 */
export function summarizeGenotypes(
  dataset: GenotypeDataset,
  options: { includeMonomorphicLoci?: boolean } = {},
): GenotypeSummary {
  requireValidGenotypeDataset('summarizeGenotypes', 'dataset', dataset)
  const includeMonomorphicLoci = options.includeMonomorphicLoci ?? true
  const loci = tallyLoci(dataset).map(locusDiversity)
  const averaged = loci.filter(locus => locus.sampleSize > 0 && (includeMonomorphicLoci || !locus.monomorphic))

  let missing = 0
  let genotypedIndividualCount = 0
  for (const individual of dataset.individuals) {
    const missingHere = individual.genotypes.filter(genotype => genotype === null).length
    missing += missingHere
    if (missingHere < individual.genotypes.length) genotypedIndividualCount += 1
  }
  const cells = dataset.individuals.length * dataset.loci.length

  const sumOf = (pick: (locus: LocusDiversity) => number | null): number =>
    averaged.reduce((sum, locus) => sum + (pick(locus) ?? 0), 0)
  const sumObserved = sumOf(locus => locus.observedHeterozygosity)
  const sumExpected = sumOf(locus => locus.expectedHeterozygosity)
  const meanOf = (pick: (locus: LocusDiversity) => number | null): number | null =>
    mean(averaged.map(locus => pick(locus) ?? 0))

  return {
    expectedHeterozygosityEstimator: 'nei-1978-unbiased',
    includesMonomorphicLoci: includeMonomorphicLoci,
    loci,
    overall: {
      individualCount: dataset.individuals.length,
      genotypedIndividualCount,
      missingGenotypeFraction: cells === 0 ? 0 : missing / cells,
      lociInMeans: averaged.map(locus => locus.locus),
      lociWithoutData: loci.filter(locus => locus.sampleSize === 0).map(locus => locus.locus),
      monomorphicLoci: loci.filter(locus => locus.monomorphic).map(locus => locus.locus),
      meanSampleSize: meanOf(locus => locus.sampleSize),
      meanAlleleCount: meanOf(locus => locus.alleleCount),
      meanObservedHeterozygosity: meanOf(locus => locus.observedHeterozygosity),
      meanExpectedHeterozygosity: meanOf(locus => locus.expectedHeterozygosity),
      meanExpectedHeterozygosityPlugIn: meanOf(locus => locus.expectedHeterozygosityPlugIn),
      meanExpectedHeterozygosityNei1987: meanOf(locus => locus.expectedHeterozygosityNei1987),
      // The number of loci cancels in mean(Ho)/mean(He).
      inbreedingCoefficient: averaged.length === 0 || sumExpected === 0 ? null : 1 - sumObserved / sumExpected,
    },
  }
}
