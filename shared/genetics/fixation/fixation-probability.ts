import type { FixationInputs } from './fixation-inputs'
import { logFixationProbabilityChecked } from './log-fixation-probability'

/**
 * Probability that an introduced allele eventually fixes (Kimura's diffusion).
 *
 * Why: the chance that an adaptive variant brought in by translocated animals
 * establishes and spreads to fixation in the recipient population
 * (SCIENCE.md §1).
 *
 * Formula (Kimura 1962, SCIENCE.md eq. 1.1):
 *   u(p) = ∫₀ᵖ G(x) dx / ∫₀¹ G(x) dx,  G(x) = exp(−2·Ne·s·(2h·x + (1−2h)·x²)),
 *   p = k / (2N) — the census N sets the starting frequency, Ne the drift.
 * For h = ½ this is (1 − e^(−2·Ne·s·p)) / (1 − e^(−2·Ne·s)); u depends on Ne
 * and s only through Ne·s. Numerics: log-space composite Gauss–Legendre with
 * breakpoints at 0, p, 1 and the stationary point x*, closed form with expm1
 * when h = ½, first-order series when |2·Ne·s| is tiny (SCIENCE.md §1.5).
 * Relative error about 10⁻¹³ against 50-digit references, plus about
 * ε·|2·Ne·s| from rounding the exponent (10⁻¹¹ at |2·Ne·s| ≈ 10⁵, up to
 * ~10⁻¹⁰ near 10⁶; ε = 2⁻⁵²).
 * Assumptions: constant Ne, s and h over the whole sojourn; random mating; no
 * further migration or mutation; one locus; weak selection (|s| ≲ 0.1) and
 * Ne not tiny — see `fixationMethodWarnings` for when the diffusion itself
 * is the error source (SCIENCE.md §1.1, §2).
 * Reference: Kimura, M. (1962). On the probability of fixation of mutant
 *   genes in a population. Genetics 47: 713–719.
 *
 * @param census - N, census number of breeding diploid adults, integer ≥ 1
 * @param effectiveSize - Ne, effective size per generation, individuals, > 0
 * @param s - selection coefficient of AA per generation (fitness 1 + s), 1 + s > 0
 * @param h - dominance, any real with 1 + h·s > 0 (h < 0 or h > 1: under-/overdominance)
 * @param copies - k, A gene copies introduced, integer in [0, 2N] (0 → 0, 2N → 1)
 * @returns u, in [0, 1]; never NaN; may underflow to 0 (use `log10FixationProbability`)
 * @throws RangeError if an argument is outside its domain
 * @example fixationProbability({ census: 100, effectiveSize: 100, s: 0.01, h: 0.5, copies: 1 })      // 0.011507542817379...
 * @example fixationProbability({ census: 10000, effectiveSize: 10000, s: 0.01, h: 0, copies: 1 })    // 0.000797884427822...
 * @example fixationProbability({ census: 50, effectiveSize: 5, s: 0, h: 0.5, copies: 7 })            // 0.07 (neutral: u = p)
 * @example fixationProbability({ census: 100, effectiveSize: 100, s: 0.02, h: -0.5, copies: 20 })    // 0.137617348592996 (underdominance)
 * @example fixationProbability({ census: 10000, effectiveSize: 10000, s: -0.5, h: 0.5, copies: 1 })  // 0 (underflow; log10 u = −4343.13...)
 * @example fixationProbability({ census: 10, effectiveSize: 10, s: 0.1, h: 0.5, copies: 20 })        // 1 (already fixed)
 */
export function fixationProbability(inputs: FixationInputs): number {
  return Math.exp(logFixationProbabilityChecked('fixationProbability', inputs))
}

/**
 * Base-10 logarithm of the diffusion fixation probability, finite where the
 * probability itself underflows double precision.
 *
 * Why: deleterious alleles in large populations have u far below 10⁻³⁰⁸;
 * the display rule shows such values as a power of ten (SCIENCE.md §1.5).
 *
 * Formula: log₁₀ u with u from `fixationProbability` (same model, same
 * assumptions), computed without ever forming u.
 * Absolute error ≤ 10⁻⁹·max(1, |value|).
 * Reference: Kimura (1962), Genetics 47: 713–719.
 *
 * @param census - N, integer ≥ 1
 * @param effectiveSize - Ne, individuals, > 0
 * @param s - selection coefficient of AA, 1 + s > 0
 * @param h - dominance, 1 + h·s > 0
 * @param copies - k, integer in [0, 2N]
 * @returns log₁₀ u, ≤ 0; −Infinity only for copies = 0; 0 for copies = 2N
 * @throws RangeError if an argument is outside its domain
 * @example log10FixationProbability({ census: 10000, effectiveSize: 10000, s: -0.01, h: 0.5, copies: 1 })    // −88.8567230987...
 * @example log10FixationProbability({ census: 10000, effectiveSize: 20000, s: -0.5, h: 0.5, copies: 200 })  // −8599.0307416... (2·Ne·s = −2×10⁴)
 * @example log10FixationProbability({ census: 10, effectiveSize: 10, s: 0.1, h: 0.5, copies: 0 })          // −Infinity
 */
export function log10FixationProbability(inputs: FixationInputs): number {
  return logFixationProbabilityChecked('log10FixationProbability', inputs) / Math.LN10
}
