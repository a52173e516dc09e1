/**
 * Published minimum-Ne rules of thumb, as cited data (SCIENCE.md §6.4).
 *
 * Short term = avoid inbreeding depression; long term = retain evolutionary
 * potential. Jamieson & Allendorf (2012) caution against conflating the two
 * numbers (or either with a minimum viable census size).
 */
export interface MinimumSizeRule {
  /** Minimum Ne to limit inbreeding depression in the short term. */
  readonly shortTermEffectiveSize: number
  /** Minimum Ne to retain evolutionary potential in the long term. */
  readonly longTermEffectiveSize: number
  /** Plain-words statement of what the numbers are for. */
  readonly meaning: string
  readonly source: string
  /** 'paper' = checked against the abstract; 'memory' = verify before quoting. */
  readonly evidence: 'paper' | 'memory'
}

export const MINIMUM_EFFECTIVE_SIZE_RULES = {
  /** The original "50/500" rule. */
  original: {
    shortTermEffectiveSize: 50,
    longTermEffectiveSize: 500,
    meaning: 'Ne of at least 50 to avoid inbreeding depression in the short term, at least 500 to retain evolutionary potential.',
    source: 'Franklin IR (1980) Evolutionary change in small populations. In Soulé ME, Wilcox BA (eds) Conservation Biology: An Evolutionary-Ecological Perspective. Sinauer [pages from memory]',
    evidence: 'memory',
  },
  /** The revised "100/1000" rule. */
  revised: {
    shortTermEffectiveSize: 100,
    longTermEffectiveSize: 1000,
    meaning: 'Ne of at least 100 to keep the loss of total fitness to 10% or less over five generations in the wild; at least 1000 to retain evolutionary potential (500 is too low).',
    source: 'Frankham R, Bradshaw CJA, Brook BW (2014) Genetics in conservation management: revised recommendations for the 50/500 rules, Red List criteria and population viability analyses. Biological Conservation 170:56–63 [abstract]',
    evidence: 'paper',
  },
} as const satisfies Record<string, MinimumSizeRule>

/** Horizon, in generations, over which the short-term rule is judged (Frankham et al. 2014). */
export const SHORT_TERM_RULE_GENERATIONS = 5
