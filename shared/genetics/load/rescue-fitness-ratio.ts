import { lethalEquivalentsPerGamete, requireInbreeding, requireLethalEquivalents } from './load-domain'

/**
 * Expected fitness of offspring with lower inbreeding (e.g. from a resident ×
 * immigrant cross) relative to resident offspring: the "masking" of drift
 * load that genetic rescue relies on.
 *
 * Why: the expected benefit side of a gene-flow proposal (SCIENCE.md §6.2).
 *
 * Formula (from the Morton–Crow–Muller model, SCIENCE.md eq. 6.1):
 *     W_off / W_res = exp(B·(F_res − F_off)),  B = 2B / 2.
 * Above 1 means the offspring are fitter.
 * Assumptions: log-linear model with the same load in both groups; ignores
 * load carried by the source, purging in the recipient, outbreeding
 * depression (see `outbreedingRisk`), partial loss of heterosis in F2/F3, and
 * demographic benefits. An expectation for the mean; families vary.
 * Reference: Morton, N. E., Crow, J. F., Muller, H. J. (1956). PNAS 42:
 *   855–863; empirical scale: Frankham, R. (2015). Molecular Ecology 24:
 *   2610–2618 (mean +148% in the wild).
 *
 * @param diploidLethalEquivalents - 2B, lethal equivalents per diploid individual, finite ≥ 0
 * @param recipientInbreeding - F_res, inbreeding of resident offspring, in [0, 1]
 * @param offspringInbreeding - F_off, inbreeding of the offspring of the
 *   proposed crosses (≈ 0 for resident × unrelated immigrant), in [0, 1]
 * @returns W_off / W_res, > 0; 1 when the two F are equal
 * @throws RangeError if an argument is outside its domain
 * @example rescueFitnessRatio({ diploidLethalEquivalents: 6, recipientInbreeding: 0.3, offspringInbreeding: 0 })      // 2.4596031111569494
 * @example rescueFitnessRatio({ diploidLethalEquivalents: 6, recipientInbreeding: 0.25, offspringInbreeding: 0.05 })  // 1.822118800390509
 * @example rescueFitnessRatio({ diploidLethalEquivalents: 6, recipientInbreeding: 0.2, offspringInbreeding: 0.2 })    // 1
 */
export function rescueFitnessRatio({ diploidLethalEquivalents, recipientInbreeding, offspringInbreeding }: {
  diploidLethalEquivalents: number
  recipientInbreeding: number
  offspringInbreeding: number
}): number {
  const fn = 'rescueFitnessRatio'
  requireLethalEquivalents(fn, diploidLethalEquivalents)
  requireInbreeding(fn, 'recipientInbreeding', recipientInbreeding)
  requireInbreeding(fn, 'offspringInbreeding', offspringInbreeding)
  return Math.exp(lethalEquivalentsPerGamete(diploidLethalEquivalents) * (recipientInbreeding - offspringInbreeding))
}
