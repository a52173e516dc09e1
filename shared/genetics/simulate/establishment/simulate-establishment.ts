import { requireInteger } from '../../validate'
import { runEstablishmentBlock } from './run-establishment-replicates'
import { summarizeEstablishment } from './summarize-establishment'
import type { EstablishmentOptions, EstablishmentParams, EstablishmentResult } from './types'

/**
 * Stochastic forward simulation of an introduced adaptive allele A at one
 * locus in the recipient population: how often, and how fast, translocations
 * establish it (carry it to fixation).
 *
 * Why: the diffusion (SCIENCE.md §1) and the exact chain (§2) answer a single
 * introduction into a population of constant size; real proposals have
 * repeated events, continuing migration and changing census and Ne. This
 * model covers those and agrees with the exact chain and the diffusion where
 * they apply (see the validation tests).
 *
 * Model, each generation t = 0, 1, …, G − 1 (p = frequency of A, starting at 0):
 * 1. Translocation event (at firstEventGeneration + i·eventInterval, i < events):
 *    k = migrantsPerEvent animals join the N_t residents, carrying c copies of
 *    A — c ~ Binomial(2k, q), or c = introducedCopies exactly. Migrants are
 *    *added*: p ← (2N_t·p + c) / (2N_t + 2k). With k = 0 and
 *    introducedCopies = c the copies replace c random resident genes:
 *    p ← p + (1 − p)·c/(2N_t); from p = 0 this is p0 = c/(2N), the census
 *    starting frequency of SCIENCE.md §0–§1.1.
 * 2. Continuing migration: p ← (1 − m)·p + m·q (island model, §4.2).
 * 3. Viability selection with fitnesses 1+s : 1+hs : 1 (§2.1, eq. 2.1).
 * 4. Wright–Fisher drift at the effective size: the number of A genes in the
 *    next generation is Binomial(n_t, p′) with n_t = max(1, round(2·Ne_t)),
 *    and p ← copies/n_t. Non-integer Ne is honoured to the nearest half
 *    individual (2Ne is rounded, not Ne).
 * So the census sets the starting frequency and the dilution by migrants
 * while Ne sets the drift, as in Kimura's treatment where u depends on
 * p0 = k/(2N) and on Ne·s (§1.1); with Ne = N and one event of k copies this
 * is exactly the Wright–Fisher chain of §2.
 *
 * Outcomes: "established" = A reaches fixation (p = 1) within the horizon, the
 * criterion of the exact chain; a fixed replicate stops there (events after
 * fixation are not simulated). "Lost" = p = 0 with no event left and no
 * continuing input of A. Otherwise "unresolved" (e.g. under continuing
 * migration with 0 < q < 1 neither state is absorbing). Finished replicates
 * stop (their later trajectory is 0 or 1). Times are generations from the
 * first event. census and effectiveSize schedules are indexed by generation.
 *
 * Randomness: replicate r uses its own stream `replicateStream(seed, r)`, so
 * results do not depend on how replicates are split between workers
 * (`runEstablishmentReplicates` + `mergeEstablishmentPartials`).
 * Cost: O(replicates × generations survived); one binomial draw per
 * replicate-generation.
 *
 * @param params - see `EstablishmentParams`: census N ≥ 1 (integer) and
 *   effectiveSize Ne > 0 (number or per-generation array), s with 1+s > 0,
 *   h with 1+hs > 0, sourceFrequency q in [0, 1] or introducedCopies ≥ 0,
 *   migrantsPerEvent k ≥ 0, eventInterval ≥ 1, events ≥ 0,
 *   migrationRate m in [0, 1] (default 0), generations G in [1, 10⁶],
 *   firstEventGeneration ≥ 0 (default 0); all times in generations
 * @param options - seed (integer), replicates (integer ≥ 1), optional
 *   onProgress(completed, total)
 * @returns counts, probability = established/replicates with its Wilson 95 %
 *   interval, waiting-time quantiles (generations) and frequency bands
 * @throws RangeError if an input is outside its domain
 * @example simulateEstablishment({ census: 10, effectiveSize: 10, s: 0.1, h: 0.5, introducedCopies: 1, migrantsPerEvent: 0, eventInterval: 1, events: 1, generations: 10000 }, { seed: 1, replicates: 20000 }).probability
 *   // ≈ 0.1076 ± 0.0022 (exact chain 0.107647940409, SCIENCE.md §11 row 16)
 * @example simulateEstablishment({ census: 50, effectiveSize: 5, s: 0, h: 0.5, introducedCopies: 7, migrantsPerEvent: 0, eventInterval: 1, events: 1, generations: 10000 }, { seed: 1, replicates: 20000 }).probability
 *   // ≈ 0.07 (neutral: p0 = 7/100)
 * @example simulateEstablishment({ census: 100, effectiveSize: 100, s: 0.1, h: 0.5, sourceFrequency: 0, migrantsPerEvent: 5, eventInterval: 1, events: 1, generations: 100 }, { seed: 1, replicates: 10 }).lost
 *   // 10 (the source lacks A)
 */
export function simulateEstablishment(params: EstablishmentParams, options: EstablishmentOptions): EstablishmentResult {
  requireInteger('simulateEstablishment', 'replicates', options.replicates, 1)
  const partial = runEstablishmentBlock('simulateEstablishment', params, {
    seed: options.seed,
    firstReplicate: 0,
    replicates: options.replicates,
    onProgress: options.onProgress,
  })
  return summarizeEstablishment(partial)
}
