import { requireInteger } from '../../validate'
import { runRescueBlock } from './run-rescue-replicates'
import { summarizeRescue } from './summarize-rescue'
import type { RescueOptions, RescueParams, RescueResult } from './types'

/**
 * Individual-based forward simulation of genetic rescue: a diploid recipient
 * population with neutral markers, a load of harmful mutations and an
 * optional adaptive variant, receiving animals from a source population on
 * a schedule, compared generation by generation with the same population
 * left alone.
 *
 * Why: the closed forms (SCIENCE.md §4, §6) give expected F, H and fitness
 * for ideal populations with a fixed load; this model lets the load evolve
 * (purging, fixation of harmful alleles by drift, their masking by
 * immigrants), includes the source's own load and the variance between
 * replicates, and measures F both from markers and from the pedigree.
 *
 * Model (one generation = discrete, non-overlapping generations):
 * - Individuals: diploid, two sexes (first ⌈N/2⌉ of each generation female).
 *   Genomes are bitsets: M neutral biallelic markers, L load loci, and one
 *   adaptive locus (unlinked); free recombination, or Poisson crossovers on
 *   a genetic map (`map`).
 * - Load: U new harmful mutations per gamete (Poisson) at random load loci,
 *   no back mutation; locus l has s_l ~ Gamma(shape, mean) capped at 1 and
 *   h_l = exp(−k·s_l)/2 with k set for the mean dominance (Deng & Lynch
 *   1996; Agrawal & Whitlock 2011 [memory]); fitness multiplicative:
 *   W = Π (1 − s)^hom (1 − hs)^het × adaptive fitness (1+s : 1+hs : 1, only
 *   in the recipient).
 * - Mating: each offspring's mother and father are drawn with probability ∝
 *   fitness × Gamma(α) reproductive weight; α is chosen per sex so that two
 *   offspring share a parent with probability 2/Ne_target — family-size
 *   variance Vk = 4(N − 1)/Ne − 2, the Ne = (4N − 2)/(Vk + 2) construction
 *   (`reproductiveWeightShape`). Target Ne/N ≤ 1.
 * - History: each population starts from a large ancestral population
 *   (markers at ½, load loci at mutation–selection balance) and is burned
 *   in for its own size history (`burnInCensus`, `burnInGenerations`,
 *   default min(4N, 200)); the adaptive allele is then given frequencies q
 *   (source) and recipientFrequency (recipient).
 * - Translocation phase (generations 0…G): events add `migrantsPerEvent`
 *   random source adults (copied; the source is not depleted) to that
 *   generation's breeding adults; under continuing migration each parent of
 *   each offspring is a random source adult with probability m. The source
 *   keeps evolving on its own schedule.
 * - Pedigree F: kinship matrix from the founders at the start of the phase
 *   (F = 0, unrelated), migrants and immigrants counted as founders
 *   (`offspringKinship` among the animals that bred, `offspringPedigree`). Marker F = 1 − H_t/H_0, same base. Loads as in
 *   `measureGeneration` (B = Σ q(1−q)s(1−2h); drift load 1 − Π_fixed(1 − s)).
 * - Paired arms: each replicate runs the phase with and without
 *   translocation from the same burned-in populations and generator state;
 *   the rescue effect is the per-replicate fitness ratio.
 *
 * Randomness: the genome (s, h per locus) from the seed's shared stream;
 * replicate r from `replicateStream(seed, r)`, so any split of replicates
 * between workers (`runRescueReplicates` + `mergeRescuePartials`) gives
 * the same result. Cost per replicate ≈ (burn-in + 3 × phase) population-
 * generations of O(N·(loci/32) + N²) each (the N² is the kinship matrix among the parents).
 *
 * @param params - see `RescueParams` (census N ≥ 2, effectiveRatio in (0, 1],
 *   generations in [1, 10 000], loci counts, load, adaptive variant,
 *   schedule, optional map); times in generations
 * @param options - seed (integer), replicates (integer ≥ 1), optional onProgress
 * @returns per-generation bands for both arms, the rescue effect and extinction counts
 * @throws RangeError if an input is outside its domain
 * @example simulateRescue({ recipient: { census: 50, effectiveRatio: 0.5, burnInGenerations: 100 }, source: { census: 200 }, generations: 20, translocation: { migrantsPerEvent: 4, eventInterval: 5, events: 4 } }, { seed: 1, replicates: 20 }).rescueEffect.q50[20]
 *   // > 1 in most runs: immigrants mask the recipient's drift load
 */
export function simulateRescue(params: RescueParams, options: RescueOptions): RescueResult {
  requireInteger('simulateRescue', 'replicates', options.replicates, 1)
  return summarizeRescue(runRescueBlock('simulateRescue', params, {
    seed: options.seed,
    firstReplicate: 0,
    replicates: options.replicates,
    onProgress: options.onProgress,
  }))
}
