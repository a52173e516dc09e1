import { hudsonLocusFst, type HudsonLocusFst } from './fst-hudson'
import { weirCockerhamLocusFst, type WeirCockerhamLocusFst } from './fst-weir-cockerham'
import { tallyLoci, type LocusTally } from './locus-tally'
import type { GenotypeDataset } from './types'
import { requireValidGenotypeDataset } from './validate-dataset'
import { domainError } from '../validate'

/** Which F_ST estimator to use. */
export type FstMethod = 'hudson' | 'weir-cockerham'

/** A shared locus that could not enter the estimate, and why. */
export interface SkippedFstLocus {
  locus: string
  reason: string
}

interface FstCommon {
  /** multi-locus F_ST; null when no locus carries information (denominator 0) */
  fst: number | null
  /** loci named in only one of the two datasets (ignored) */
  unsharedLoci: string[]
  /** shared loci left out, with the reason */
  skippedLoci: SkippedFstLocus[]
}

/** Hudson et al. (1992) F_ST with the Bhatia et al. (2013) ratio of averages. */
export interface HudsonFstResult extends FstCommon {
  method: 'hudson'
  loci: HudsonLocusFst[]
}

/** Weir & Cockerham (1984) θ with F_IT and f from the same variance components. */
export interface WeirCockerhamFstResult extends FstCommon {
  method: 'weir-cockerham'
  loci: WeirCockerhamLocusFst[]
  /** F_IT = 1 − Σc/Σ(a + b + c) */
  totalInbreeding: number | null
  /** f (F_IS) = 1 − Σc/Σ(b + c) */
  withinPopulationInbreeding: number | null
}

export type PairwiseFstResult = HudsonFstResult | WeirCockerhamFstResult

/** Options of `pairwiseFst` and `fstMatrix`. */
export interface FstOptions {
  method: FstMethod
}

function ratioOrNull(numerator: number, denominator: number): number | null {
  return denominator === 0 ? null : numerator / denominator
}

function skipReason(first: LocusTally, second: LocusTally, method: FstMethod): string | null {
  if (first.sampleSize === 0) return 'no genotyped individual in the first population'
  if (second.sampleSize === 0) return 'no genotyped individual in the second population'
  if (method === 'weir-cockerham' && first.sampleSize + second.sampleSize < 3) {
    return 'only one genotyped individual in each population (n̄ − 1 = 0)'
  }
  return null
}

/**
 * Pairwise F_ST from already tallied loci; the first population's locus
 * order drives the per-locus output (internal: `fstMatrix` tallies once).
 */
export function fstFromTallies(first: LocusTally[], second: LocusTally[], method: FstMethod): PairwiseFstResult {
  const secondByLocus = new Map(second.map(tally => [tally.locus, tally]))
  const firstNames = new Set(first.map(tally => tally.locus))
  const unsharedLoci = [
    ...first.filter(tally => !secondByLocus.has(tally.locus)).map(tally => tally.locus),
    ...second.filter(tally => !firstNames.has(tally.locus)).map(tally => tally.locus),
  ]
  const skippedLoci: SkippedFstLocus[] = []
  const pairs: [LocusTally, LocusTally][] = []
  for (const tally of first) {
    const other = secondByLocus.get(tally.locus)
    if (!other) continue
    const reason = skipReason(tally, other, method)
    if (reason) skippedLoci.push({ locus: tally.locus, reason })
    else pairs.push([tally, other])
  }

  if (method === 'hudson') {
    const loci = pairs.map(([one, two]) => hudsonLocusFst(one, two))
    let sumWithin = 0
    let sumBetween = 0
    for (const locus of loci) {
      sumWithin += locus.withinPopulationDiversity
      sumBetween += locus.betweenPopulationDiversity
    }
    const ratio = ratioOrNull(sumWithin, sumBetween)
    return { method, fst: ratio === null ? null : 1 - ratio, loci, unsharedLoci, skippedLoci }
  }

  const loci = pairs.map(([one, two]) => weirCockerhamLocusFst(one, two))
  let sumA = 0
  let sumB = 0
  let sumC = 0
  for (const locus of loci) {
    sumA += locus.amongPopulations
    sumB += locus.amongIndividuals
    sumC += locus.withinIndividuals
  }
  const total = sumA + sumB + sumC
  const withinShare = ratioOrNull(sumC, total)
  const withinIndividualShare = ratioOrNull(sumC, sumB + sumC)
  return {
    method,
    fst: ratioOrNull(sumA, total),
    totalInbreeding: withinShare === null ? null : 1 - withinShare,
    withinPopulationInbreeding: withinIndividualShare === null ? null : 1 - withinIndividualShare,
    loci,
    unsharedLoci,
    skippedLoci,
  }
}

/** Throws the standard RangeError unless `method` is a known estimator. */
export function requireFstMethod(fn: string, method: unknown): void {
  if (method !== 'hudson' && method !== 'weir-cockerham') domainError(fn, 'options.method', '"hudson" or "weir-cockerham"', method)
}

/**
 * Genetic differentiation F_ST between two population samples, multi-locus
 * and per locus, by one of two standard estimators.
 *
 * Why: F_ST says how far two subpopulations have drifted apart, which guides
 * the choice of source population and the expected genetic effect of moving
 * animals between them.
 *
 * Formulas (SCIENCE.md §8.1), loci matched by name, each locus using only
 * the individuals genotyped there (n may differ between loci and populations):
 * - 'hudson' — Hudson, Slatkin & Maddison (1992) as formulated by Bhatia et
 *   al. (2013): H_w = mean over the two populations of [G/(G − 1)](1 − Σpᵢ²)
 *   (G = 2n gene copies), H_b = 1 − Σp₁ᵢp₂ᵢ; F_ST = 1 − ΣH_w/ΣH_b, a ratio
 *   of sums over loci (not a mean of per-locus ratios).
 * - 'weir-cockerham' — Weir & Cockerham (1984) θ for r = 2 populations,
 *   multi-allelic: variance components a, b, c summed over alleles and loci,
 *   θ = Σa/Σ(a + b + c); also F_IT = 1 − Σc/Σ(a + b + c) and
 *   f = 1 − Σc/Σ(b + c).
 * Behaviour: both estimators are unbiased for sampling and can be negative
 * when the populations do not differ; values are reported as computed, never
 * truncated at 0 (a display may floor at 0 with a note). Comparing a sample
 * with itself gives Hudson 1 − ΣG/(G − 1)·Hₗ/ΣHₗ < 0 and θ ≤ 0, not 0.
 * Skipped loci (listed with reasons): not genotyped in one population; for
 * θ also n₁ = n₂ = 1. Loci monomorphic in both populations contribute 0 to
 * every sum. The result is null (not NaN) when every denominator is 0.
 * References: Hudson, R. R., Slatkin, M., Maddison, W. P. (1992). Estimation
 *   of levels of gene flow from DNA sequence data. Genetics 132: 583–589.
 *   Bhatia, G., Patterson, N., Sankararaman, S., Price, A. L. (2013).
 *   Estimating and interpreting FST: the impact of rare variants. Genome
 *   Research 23: 1514–1521 [from memory].
 *   Weir, B. S., Cockerham, C. C. (1984). Estimating F-statistics for the
 *   analysis of population structure. Evolution 38: 1358–1370.
 *
 * @param first - first population sample
 * @param second - second population sample
 * @param options.method - 'hudson' or 'weir-cockerham'
 * @returns multi-locus `fst` (dimensionless, ≤ 1, may be negative), per-locus
 *   terms in the first dataset's locus order, and the loci not used
 * @throws RangeError for an unknown method or an invalid dataset
 * @example pairwiseFst(alderHollow, cinderFlats, { method: 'hudson' }).fst          // 0.25441948351879073 (SCIENCE.md §8.3: 0.254419483518791)
 * @example pairwiseFst(alderHollow, cinderFlats, { method: 'weir-cockerham' }).fst  // 0.24811315751243485 (SCIENCE.md §8.3: 0.248113157512435)
 * @example pairwiseFst(alderHollow, alderHollow, { method: 'hudson' }).fst          // -0.09090909090909083 (= −1/11)
 * @example pairwiseFst(fixedA, fixedA, { method: 'hudson' }).fst  // null (every locus fixed for one allele)
 */
export function pairwiseFst(first: GenotypeDataset, second: GenotypeDataset, options: { method: 'hudson' }): HudsonFstResult
export function pairwiseFst(first: GenotypeDataset, second: GenotypeDataset, options: { method: 'weir-cockerham' }): WeirCockerhamFstResult
export function pairwiseFst(first: GenotypeDataset, second: GenotypeDataset, options: FstOptions): PairwiseFstResult
export function pairwiseFst(first: GenotypeDataset, second: GenotypeDataset, options: FstOptions): PairwiseFstResult {
  const fn = 'pairwiseFst'
  requireFstMethod(fn, options?.method)
  requireValidGenotypeDataset(fn, 'first', first)
  requireValidGenotypeDataset(fn, 'second', second)
  return fstFromTallies(tallyLoci(first), tallyLoci(second), options.method)
}
