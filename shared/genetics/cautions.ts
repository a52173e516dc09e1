/**
 * Cautions the interface shows beside engine results, as data.
 *
 * Single source of truth for the wording of every caution in SCIENCE.md
 * (§1.1, §1.3–1.5, §2, §3.3, §4.2, §5, §6.2, §9, §10), written in our own
 * plain words. Read by:
 *   - shared/genetics/fixation/fixation-method-warnings.ts (condition → id);
 *   - the results and method panels and the PDF brief (id → title and text).
 * Editing a text changes what users read everywhere; adding an id needs a
 * matching entry here (the Record type enforces it). Ids are stable: stored
 * briefs may refer to them.
 */

/** Topic a caution belongs to, so a panel can pick its own. */
export type CautionTopic = 'fixation' | 'fixation-time' | 'drift' | 'effective-size' | 'load' | 'outbreeding' | 'genotypes' | 'units'

/** Stable identifiers of every caution. */
export type CautionId
  = | 'constant-selection'
    | 'effective-size-sets-drift'
    | 'diffusion-assumptions'
    | 'probability-display'
    | 'very-small-effective-size'
    | 'strong-selection'
    | 'effectively-neutral'
    | 'under-or-overdominance'
    | 'deleterious-relative-error'
    | 'exact-chain-preferred'
    | 'rule-of-thumb-only'
    | 'branching-early-phase-only'
    | 'fixation-time-spread'
    | 'fixation-time-horizon'
    | 'generations-not-years'
    | 'per-generation-effective-size'
    | 'effective-size-above-twice-census'
    | 'lethal-equivalents-ploidy'
    | 'recent-immigrants-bias-estimates'
    | 'outbreeding-unknown-treated-as-elevated'
    | 'island-model-assumptions'
    | 'demographic-effective-size-is-a-prediction'
    | 'rescue-prediction-limits'

/** One caution: what the user reads and where it comes from. */
export interface Caution {
  id: CautionId
  topic: CautionTopic
  /** Short heading, sentence case. */
  title: string
  /** One to three plain sentences. */
  text: string
  /** Literature or computation behind the statement (SCIENCE.md section in brackets). */
  source: string
}

/** Every caution, by id. */
export const CAUTIONS: Readonly<Record<CautionId, Caution>> = {
  'constant-selection': {
    id: 'constant-selection',
    topic: 'fixation',
    title: 'Selection assumed constant',
    text: 'The establishment chance assumes the allele keeps the same advantage s for hundreds of generations. '
      + 'For a translocated adaptive variant s is seldom known to better than a factor of 2 or 3, so look at results over a range of s.',
    source: 'Kimura (1962), Genetics 47: 713–719, model assumptions [SCIENCE.md §1.1, §1.5]',
  },
  'effective-size-sets-drift': {
    id: 'effective-size-sets-drift',
    topic: 'fixation',
    title: 'Effective size, not census size, sets drift',
    text: 'Chance losses depend on the effective size Ne, while the starting share of the allele depends on the census count. '
      + 'Where Ne is about a tenth of the census, a single introduced advantageous copy is about ten times less likely to establish than "2hs" suggests.',
    source: 'Kimura (1964), J. Appl. Probab. 1: 177–232; reference computation [SCIENCE.md §1.1, §1.3, §1.5]',
  },
  'diffusion-assumptions': {
    id: 'diffusion-assumptions',
    topic: 'fixation',
    title: 'What the calculation assumes',
    text: 'Constant Ne over the whole period (use the harmonic mean if size fluctuates), random mating, no further immigration or mutation after the release, '
      + 'a single gene not linked to other selected genes, weak selection, and generations that do not overlap (otherwise use per-generation Ne and convert with the generation length).',
    source: 'Kimura (1962), Genetics 47: 713–719 [SCIENCE.md §1.1]',
  },
  'probability-display': {
    id: 'probability-display',
    topic: 'fixation',
    title: 'How very small probabilities are shown',
    text: 'A probability below one in a million is shown as "< 1 in a million"; below 10⁻³⁰⁰ it is shown as a power of ten. '
      + 'Such values mean "practically never", not a precise prediction.',
    source: 'Display rule [SCIENCE.md §1.5, §10]',
  },
  'very-small-effective-size': {
    id: 'very-small-effective-size',
    topic: 'fixation',
    title: 'Very small effective size',
    text: 'With Ne below about 10 the smooth approximation behind this result and the Ne formulas become unreliable. '
      + 'Treat the figure as indicative, or use the exact generation-by-generation model where it is offered.',
    source: 'Comparison with the exact Wright–Fisher chain, reference computation [SCIENCE.md §1.5 item 6, §2, §10]',
  },
  'strong-selection': {
    id: 'strong-selection',
    topic: 'fixation',
    title: 'Strong selection',
    text: 'With |s| of 0.1 or more the approximation overstates the establishment chance by up to about 5% at s = 0.1 and up to 20% at s = 0.5, '
      + 'and understates the time to fixation by up to about 16% at s = 0.5. Population size does not cure this.',
    source: 'Comparison with the exact Wright–Fisher chain, reference computation [SCIENCE.md §2.3, §3.3, §10]',
  },
  'effectively-neutral': {
    id: 'effectively-neutral',
    topic: 'fixation',
    title: 'Effectively neutral',
    text: 'Here 2·Ne·|s| is below 1: chance dominates and the allele behaves almost as if it had no effect, '
      + 'so its chance of fixing is close to its starting share.',
    source: 'Kimura (1962), Genetics 47: 713–719 [SCIENCE.md §1.2, §10]',
  },
  'under-or-overdominance': {
    id: 'under-or-overdominance',
    topic: 'fixation',
    title: 'Heterozygotes outside the homozygote range',
    text: 'When heterozygotes are fitter than both homozygotes (overdominance) selection keeps both alleles, so fixation is not where the population heads; '
      + 'when they are less fit (underdominance) an allele must cross a fitness valley and the outcome depends strongly on the starting share.',
    source: 'Kimura (1962), Genetics 47: 713–719 [SCIENCE.md §1.5 item 4, §10]',
  },
  'deleterious-relative-error': {
    id: 'deleterious-relative-error',
    topic: 'fixation',
    title: 'Harmful allele in a larger population',
    text: 'For a harmful allele with 2·Ne·|s| of 10 or more the probability is tiny and the approximation can be 6–15% high in relative terms. '
      + 'The conclusion "practically never" is unaffected.',
    source: 'Comparison with the exact Wright–Fisher chain, reference computation [SCIENCE.md §2.3]',
  },
  'exact-chain-preferred': {
    id: 'exact-chain-preferred',
    topic: 'fixation',
    title: 'Exact model available',
    text: 'For this small population with Ne equal to the census size, the exact generation-by-generation model is cheap to run and more accurate than the smooth approximation; prefer it.',
    source: 'Reference computation [SCIENCE.md §1.4, §1.5 item 6, §2.2]',
  },
  'rule-of-thumb-only': {
    id: 'rule-of-thumb-only',
    topic: 'fixation',
    title: '"2hs" is a rule of thumb',
    text: 'Twice the heterozygote advantage, scaled by Ne/N, is shown for comparison only. '
      + 'It is within about 14% of the full result only when the heterozygote is favoured, 4·Ne·h·s is at least 10 and s is at most 0.05; '
      + 'it ignores recessive advantages and overstates strong selection.',
    source: 'Haldane (1927), Proc. Camb. Phil. Soc. 23: 838–844; Kimura (1964); reference computation [SCIENCE.md §1.3]',
  },
  'branching-early-phase-only': {
    id: 'branching-early-phase-only',
    topic: 'fixation',
    title: 'Branching value covers only the rare phase',
    text: 'The branching-process value describes whether a single rare copy escapes early loss in a very large population. '
      + 'It is close to the exact answer for additive alleles under strong selection but can be well off for partly recessive or dominant ones.',
    source: 'Haldane (1927)-type argument; reference computation [SCIENCE.md §1.4]',
  },
  'fixation-time-spread': {
    id: 'fixation-time-spread',
    topic: 'fixation-time',
    title: 'Times are averages with a wide spread',
    text: 'The time shown is the mean number of generations among the cases where the allele does fix. '
      + 'Individual outcomes vary widely: for a neutral allele the standard deviation is about half the mean.',
    source: 'Kimura & Ohta (1969), Genetics 61: 763–771; Narain (1970) [SCIENCE.md §3.2, §3.3]',
  },
  'fixation-time-horizon': {
    id: 'fixation-time-horizon',
    topic: 'fixation-time',
    title: 'Establishment matters more than fixation time',
    text: 'The chance of establishment is the figure that matters for management; complete fixation usually takes far longer than any management horizon.',
    source: '[SCIENCE.md §3.3]',
  },
  'generations-not-years': {
    id: 'generations-not-years',
    topic: 'units',
    title: 'Generations, not years',
    text: 'Results are per generation. Multiply by the generation length (the mean age of parents when young are born, not the age at first breeding) to get years: '
      + '200 generations is 400 years at 2 years per generation and 1600 years at 8.',
    source: 'Standard definition of generation length [SCIENCE.md §10]',
  },
  'per-generation-effective-size': {
    id: 'per-generation-effective-size',
    topic: 'units',
    title: 'Use the effective size per generation',
    text: 'Ne here is per generation. For species with overlapping generations, the yearly effective number of breeders is a different quantity and cannot be used in its place.',
    source: '[SCIENCE.md §5, §10]',
  },
  'effective-size-above-twice-census': {
    id: 'effective-size-above-twice-census',
    topic: 'effective-size',
    title: 'Effective size above twice the census',
    text: 'An effective size larger than twice the census count is implausible unless family sizes are actively equalised. Check the inputs.',
    source: '[SCIENCE.md §5, §10]',
  },
  'lethal-equivalents-ploidy': {
    id: 'lethal-equivalents-ploidy',
    topic: 'load',
    title: 'Haploid or diploid lethal equivalents?',
    text: 'Published lethal equivalents are given either per gamete (B) or per individual (2B); the two differ by a factor of 2. State which one the figure is.',
    source: 'Morton, Crow & Muller (1956), PNAS 42: 855–863 [SCIENCE.md §6.1, §10]',
  },
  'recent-immigrants-bias-estimates': {
    id: 'recent-immigrants-bias-estimates',
    topic: 'genotypes',
    title: 'Recent immigrants distort Ne estimates',
    text: 'If immigrants arrived in the last few generations, genetic estimates of Ne from linkage disequilibrium or from changes in allele frequency are biased low. '
      + 'Do not use them for a population that was recently rescued.',
    source: 'Waples (1989), Genetics 121: 379–391; Waples (2006), Conserv. Genet. 7: 167–184 [SCIENCE.md §9, §10]',
  },
  'outbreeding-unknown-treated-as-elevated': {
    id: 'outbreeding-unknown-treated-as-elevated',
    topic: 'outbreeding',
    title: 'Unknown answers count as risk',
    text: 'Any question of the outbreeding-depression screen answered "unknown" is treated as elevated risk.',
    source: 'Frankham et al. (2011), Conserv. Biol. 25: 465–475 [SCIENCE.md §7, §10]',
  },
  'island-model-assumptions': {
    id: 'island-model-assumptions',
    topic: 'drift',
    title: 'What the migration model assumes',
    text: 'A very large source, immigrants that breed like residents (m counts genes contributed, not animals moved), constant m and Ne, and neutral genes. '
      + 'The equilibrium value says nothing about how fast inbreeding falls after a rescue.',
    source: 'Wright (1931), Genetics 16: 97–159 [SCIENCE.md §4.2]',
  },
  'demographic-effective-size-is-a-prediction': {
    id: 'demographic-effective-size-is-a-prediction',
    topic: 'effective-size',
    title: 'Ne from demography is a prediction',
    text: 'Ne computed from sex ratio, family sizes or fluctuating numbers is a prediction; genetic estimates measure the realised value. '
      + 'For overlapping generations family size must be lifetime reproductive success.',
    source: 'Wright (1931); Crow & Denniston (1988) [SCIENCE.md §5]',
  },
  'rescue-prediction-limits': {
    id: 'rescue-prediction-limits',
    topic: 'load',
    title: 'What the fitness prediction leaves out',
    text: 'The predicted gain ignores load carried by the source population, purging in the recipient, outbreeding depression, partial loss of hybrid vigour in later generations '
      + 'and demographic benefits. It is an average; individual families vary.',
    source: 'Morton, Crow & Muller (1956) model [SCIENCE.md §6.2]',
  },
}

/** Cautions always shown beside a fixation probability. */
export const FIXATION_PROBABILITY_CAUTIONS: readonly CautionId[] = [
  'constant-selection',
  'effective-size-sets-drift',
  'diffusion-assumptions',
  'probability-display',
]

/** Cautions always shown beside a conditional fixation time. */
export const FIXATION_TIME_CAUTIONS: readonly CautionId[] = [
  'fixation-time-spread',
  'fixation-time-horizon',
  'generations-not-years',
]

/**
 * The caution records for a list of ids, in the given order.
 *
 * @param ids - caution ids, e.g. from `fixationMethodWarnings`
 * @returns the matching `Caution` objects
 * @example cautionsFor(['strong-selection'])[0]?.title  // 'Strong selection'
 */
export function cautionsFor(ids: readonly CautionId[]): Caution[] {
  return ids.map(id => CAUTIONS[id])
}
