import { requireCopies, requireSelectionInputs } from './fixation-inputs'
import type { SelectionInputs } from './fixation-inputs'

/** Result of `haldaneApproximation`; both numbers are approximations, not the model value. */
export interface HaldaneApproximation {
  /** Always 'approximation': label shown beside the full diffusion result. */
  kind: 'approximation'
  /** Rule of thumb 2·h·s·(Ne/N)·k (not capped: above 1 it has no meaning as a probability). */
  linear: number
  /** Saturating form 1 − exp(−2·h·s·(Ne/N)·k); equals `linear` to first order. */
  saturating: number
  /**
   * True when the UI rule of SCIENCE.md §1.3 holds: h > 0, 4·Ne·h·s ≥ 10 and
   * s ≤ 0.05. On the SCIENCE.md grid both forms are then within −14%/+7% of
   * the diffusion value for a single copy (within 0.5% for h = ½); for 5 or
   * 20 copies the saturating form keeps that band while the linear form runs
   * up to 25% high (it ignores saturation).
   */
  withinValidity: boolean
}

/**
 * Haldane's "twice the heterozygote advantage" establishment chance, with
 * Kimura's Ne/N correction — an approximation to show beside the diffusion.
 *
 * Why: 2hs is the figure managers meet in the literature; showing it next to
 * the full result, flagged when outside its validity, makes clear how far off
 * it can be (SCIENCE.md §1.3 table: a factor 5.5 when drift dominates, 10×
 * when the Ne/N factor is forgotten).
 *
 * Formula (SCIENCE.md eq. 1.3, k copies): with p = k/(2N) and the integrals
 * of G dominated by small x, u ≈ 1 − exp(−4·Ne·h·s·p) = 1 − exp(−2·h·s·(Ne/N)·k)
 * ≈ 2·h·s·(Ne/N)·k. Our s is the AA advantage; h·s is the heterozygote's.
 * Assumptions: h > 0, 4·Ne·h·s ≫ 1, s small, few copies (k ≪ 2N); for
 * h ≤ 0 or s ≤ 0 the numbers are returned but meaningless (≤ 0). The validity
 * rule was checked on the SCIENCE.md grid for single copies.
 * Reference: Haldane, J.B.S. (1927). A mathematical theory of natural and
 *   artificial selection, part V. Proc. Camb. Phil. Soc. 23: 838–844;
 *   Ne/N factor from Kimura, M. (1964). J. Appl. Probab. 1: 177–232.
 *
 * @param census - N, census number of breeding diploid adults, integer ≥ 1
 * @param effectiveSize - Ne, individuals, > 0
 * @param s - selection coefficient of AA per generation, 1 + s > 0
 * @param h - dominance, 1 + h·s > 0
 * @param copies - k, A gene copies introduced, integer in [1, 2N]; default 1
 * @returns the linear and saturating forms and the validity flag
 * @throws RangeError if an argument is outside its domain
 * @example haldaneApproximation({ census: 10000, effectiveSize: 1000, s: 0.1, h: 0.5 })
 *   // { kind: 'approximation', linear: 0.01, saturating: 0.009950166250831947, withinValidity: false } (s > 0.05)
 * @example haldaneApproximation({ census: 1000, effectiveSize: 1000, s: 0.02, h: 0.5 })
 *   // { kind: 'approximation', linear: 0.02, saturating: 0.0198013266932447, withinValidity: true }
 * @example haldaneApproximation({ census: 10000, effectiveSize: 10000, s: 0.01, h: 0 })
 *   // { kind: 'approximation', linear: 0, saturating: 0, withinValidity: false } (recessive: true u ≈ 8×10⁻⁴)
 */
export function haldaneApproximation(inputs: SelectionInputs & { copies?: number }): HaldaneApproximation {
  const fn = 'haldaneApproximation'
  requireSelectionInputs(fn, inputs)
  const { census, effectiveSize, s, h } = inputs
  const copies = inputs.copies ?? 1
  requireCopies(fn, census, copies, 1)
  const linear = (2 * h * s * effectiveSize * copies) / census
  return {
    kind: 'approximation',
    linear,
    saturating: -Math.expm1(-linear),
    withinValidity: h > 0 && 4 * effectiveSize * h * s >= 10 && s <= 0.05,
  }
}
