import { lethalEquivalentsPerGamete, requireInbreeding, requireLethalEquivalents } from './load-domain'

/**
 * Expected fitness of inbred individuals relative to non-inbred ones, from
 * the number of lethal equivalents.
 *
 * Why: converts projected inbreeding into an expected loss of survival or
 * total fitness — the cost of doing nothing (SCIENCE.md §6.1).
 *
 * Formula (Morton, Crow & Muller 1956): ln W = ln W₀ − B·F, so
 *     W / W₀ = exp(−B·F),  with B = 2B / 2.
 * The input is the **diploid** number 2B (how conservation papers report
 * it); B is lethal equivalents per gamete. Passing a haploid figure here
 * halves the predicted depression; passing a diploid figure as B doubles it.
 * Assumptions: multiplicative effects across loci (log-linear in F); F
 * relative to a base population whose load was at equilibrium; no purging
 * during inbreeding (purging makes the prediction pessimistic for slow
 * inbreeding); same environment (depression is larger in the wild).
 * Reference: Morton, N. E., Crow, J. F., Muller, H. J. (1956). An estimate of
 *   the mutational damage in man from data on consanguineous marriages.
 *   PNAS 42: 855–863. Magnitudes: Ralls et al. (1988); O'Grady et al. (2006).
 *
 * @param diploidLethalEquivalents - 2B, lethal equivalents per diploid
 *   individual, finite ≥ 0 (defaults in `DEFAULT_DIPLOID_LETHAL_EQUIVALENTS`)
 * @param inbreeding - F, inbreeding coefficient, in [0, 1]
 * @returns W / W₀, in (0, 1]; 1 when F = 0 or 2B = 0
 * @throws RangeError if an argument is outside its domain
 * @example relativeFitness({ diploidLethalEquivalents: 3.14, inbreeding: 0.25 })  // 0.6753663463525845
 * @example relativeFitness({ diploidLethalEquivalents: 12, inbreeding: 0.25 })    // 0.22313016014842982
 * @example relativeFitness({ diploidLethalEquivalents: 12, inbreeding: 0 })       // 1
 */
export function relativeFitness({ diploidLethalEquivalents, inbreeding }: {
  diploidLethalEquivalents: number
  inbreeding: number
}): number {
  const fn = 'relativeFitness'
  requireLethalEquivalents(fn, diploidLethalEquivalents)
  requireInbreeding(fn, 'inbreeding', inbreeding)
  return Math.exp(-lethalEquivalentsPerGamete(diploidLethalEquivalents) * inbreeding)
}
