import type { CautionId } from '../cautions'
import { requireSelectionInputs } from './fixation-inputs'
import type { SelectionInputs } from './fixation-inputs'

/** Below this Ne the diffusion and the Ne formulas are unreliable (SCIENCE.md §10). */
const SMALL_EFFECTIVE_SIZE = 10
/** |s| at or above this is "strong selection" for the diffusion (SCIENCE.md §2, §10). */
const STRONG_SELECTION = 0.1
/** 2·Ne·|s| below this is effectively neutral (SCIENCE.md §10). */
const NEUTRAL_STRENGTH = 1
/** 2·Ne·|s| at or above this makes a deleterious u several % high in relative terms (SCIENCE.md §2.3). */
const DELETERIOUS_STRENGTH = 10
/** Largest 2N for which the exact Wright–Fisher chain is cheap (SCIENCE.md §2.2). */
const EXACT_CHAIN_GENE_COPIES = 400

/**
 * Cautions that apply to a diffusion fixation result for these inputs.
 *
 * Why: the diffusion is a large-N, weak-selection limit; where it is itself
 * the error source (not the numerics) the user must be told (SCIENCE.md §1.5
 * item 6, §2, §10). The general cautions shown with every result are listed
 * in `FIXATION_PROBABILITY_CAUTIONS` (shared/genetics/cautions.ts).
 *
 * Rules (ids from shared/genetics/cautions.ts, returned in this order):
 *   very-small-effective-size           Ne < 10
 *   effective-size-above-twice-census   Ne > 2N
 *   strong-selection                    |s| ≥ 0.1
 *   effectively-neutral                 2·Ne·|s| < 1
 *   under-or-overdominance              h < 0 or h > 1
 *   deleterious-relative-error          s < 0 and 2·Ne·|s| ≥ 10
 *   exact-chain-preferred               Ne = N, 2N ≤ 400, and |s| ≥ 0.1 or Ne < 10
 * Reference: thresholds from the comparison with the exact Wright–Fisher
 *   chain in SCIENCE.md §2.3 and the flag table in §10.
 *
 * @param census - N, integer ≥ 1
 * @param effectiveSize - Ne, individuals, > 0
 * @param s - selection coefficient of AA, 1 + s > 0
 * @param h - dominance, 1 + h·s > 0
 * @returns caution ids that apply (empty when none)
 * @throws RangeError if an argument is outside its domain
 * @example fixationMethodWarnings({ census: 100, effectiveSize: 100, s: 0.01, h: 0.5 })  // []
 * @example fixationMethodWarnings({ census: 5, effectiveSize: 5, s: 0.5, h: 1 })
 *   // ['very-small-effective-size', 'strong-selection', 'exact-chain-preferred']
 * @example fixationMethodWarnings({ census: 1000, effectiveSize: 1000, s: 0.0001, h: 1.5 })
 *   // ['effectively-neutral', 'under-or-overdominance']
 */
export function fixationMethodWarnings(inputs: SelectionInputs): CautionId[] {
  requireSelectionInputs('fixationMethodWarnings', inputs)
  const { census, effectiveSize, s, h } = inputs
  const strength = 2 * effectiveSize * Math.abs(s)
  const warnings: CautionId[] = []
  const smallEffectiveSize = effectiveSize < SMALL_EFFECTIVE_SIZE
  const strongSelection = Math.abs(s) >= STRONG_SELECTION
  if (smallEffectiveSize) warnings.push('very-small-effective-size')
  if (effectiveSize > 2 * census) warnings.push('effective-size-above-twice-census')
  if (strongSelection) warnings.push('strong-selection')
  if (strength < NEUTRAL_STRENGTH) warnings.push('effectively-neutral')
  if (h < 0 || h > 1) warnings.push('under-or-overdominance')
  if (s < 0 && strength >= DELETERIOUS_STRENGTH) warnings.push('deleterious-relative-error')
  if (effectiveSize === census && 2 * census <= EXACT_CHAIN_GENE_COPIES && (strongSelection || smallEffectiveSize)) {
    warnings.push('exact-chain-preferred')
  }
  return warnings
}
