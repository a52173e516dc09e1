/**
 * Published empirical sizes of genetic-rescue effects, as cited data for
 * comparison with model predictions (SCIENCE.md §6.3). Gains are fractional
 * increases in composite fitness (reproduction × survival): 1.48 = +148%.
 */
export const GENETIC_RESCUE_META_ANALYSES = {
  /** Frankham (2015): 156 cases of outcrossing inbred populations. */
  outcrossingBenefits: {
    cases: 156,
    shareBeneficial: 0.93,
    meanCompositeFitnessGainStressful: 1.48,
    meanCompositeFitnessGainBenign: 0.45,
    note: 'Benefits similar for invertebrates, vertebrates and plants; evolutionary potential also improved.',
    source: 'Frankham R (2015) Genetic rescue of small inbred populations: meta-analysis reveals large and consistent benefits of gene flow. Molecular Ecology 24:2610–2618 [abstract]',
  },
  /** Frankham (2016): persistence of benefits in crosses screened as low outbreeding risk. */
  persistenceByGeneration: {
    shareBeneficial: { F1: 0.905, F2: 1, F3: 0.941 },
    medianCompositeFitnessGain: { F1: 0.42, F2: 0.84, F3: 0.86 },
    note: 'Crosses pre-screened as low risk of outbreeding depression; F2/F3 effects not significantly different from F1. "F3" covers F3 and later.',
    source: 'Frankham R (2016) Genetic rescue benefits persist to at least the F3 generation, based on a meta-analysis. Biological Conservation 195:33–36 [abstract]',
  },
} as const
