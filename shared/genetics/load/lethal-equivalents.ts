/**
 * Published lethal-equivalent magnitudes and the engine's defaults, as cited
 * data (SCIENCE.md §6.1).
 *
 * Convention: every number here is **diploid** lethal equivalents (2B, per
 * individual), the way conservation papers report them. The Morton–Crow–
 * Muller model uses B = 2B / 2 per gamete; the fitness functions in this
 * folder take the diploid number and halve it themselves.
 */
export interface LethalEquivalentEstimate {
  /** Diploid lethal equivalents (2B). */
  readonly diploidLethalEquivalents: number
  /** Fitness component and setting the figure describes. */
  readonly scope: string
  readonly source: string
  /** 'paper' = checked against the abstract; 'memory' = verify before quoting. */
  readonly evidence: 'paper' | 'memory'
}

export const PUBLISHED_LETHAL_EQUIVALENTS = {
  /** Ralls, Ballou & Templeton (1988): median over 40 captive mammal populations. */
  captiveMammalJuvenileSurvivalMedian: {
    diploidLethalEquivalents: 3.1,
    scope: 'Juvenile survival, 40 captive mammal populations of 38 species (median).',
    source: 'Ralls K, Ballou JD, Templeton A (1988) Estimates of lethal equivalents and the cost of inbreeding in mammals. Conservation Biology 2:185–193 [abstract]',
    evidence: 'paper',
  },
  /** The same median as it is often quoted, to two decimals. */
  captiveMammalJuvenileSurvivalMedianQuoted: {
    diploidLethalEquivalents: 3.14,
    scope: 'Juvenile survival in captive mammals (median as commonly quoted).',
    source: 'Ralls K, Ballou JD, Templeton A (1988) Conservation Biology 2:185–193 [figure 3.14 as often quoted — memory, verify]',
    evidence: 'memory',
  },
  /** Ralls, Ballou & Templeton (1988): mean over the same populations. */
  captiveMammalJuvenileSurvivalMean: {
    diploidLethalEquivalents: 4.6,
    scope: 'Juvenile survival, 40 captive mammal populations of 38 species (mean; range −1.4 to 30.3).',
    source: 'Ralls K, Ballou JD, Templeton A (1988) Conservation Biology 2:185–193 [abstract]',
    evidence: 'paper',
  },
  /** O'Grady et al. (2006): whole life history in the wild. */
  wildMammalsAndBirdsLifeHistory: {
    diploidLethalEquivalents: 12,
    scope: 'Whole life history (total fitness) in wild mammals and birds (meta-analysis; "about 12").',
    source: 'O\'Grady JJ, Brook BW, Reed DH, Ballou JD, Tonkyn DW, Frankham R (2006) Realistic levels of inbreeding depression strongly affect extinction risk in wild populations. Biological Conservation 133:42–51 [abstract]',
    evidence: 'paper',
  },
} as const satisfies Record<string, LethalEquivalentEstimate>

/** Range of the Ralls et al. (1988) estimates, diploid [paper: abstract]. */
export const CAPTIVE_MAMMAL_LETHAL_EQUIVALENT_RANGE = { low: -1.4, high: 30.3 } as const

/**
 * Engine defaults for diploid lethal equivalents (SCIENCE.md §6.1); always
 * user-editable and shown as assumptions.
 * - juvenileSurvival 3.14: Ralls et al. (1988) median as commonly quoted.
 * - totalFitnessWild 12: O'Grady et al. (2006), whole life history in the wild.
 */
export const DEFAULT_DIPLOID_LETHAL_EQUIVALENTS = {
  juvenileSurvival: PUBLISHED_LETHAL_EQUIVALENTS.captiveMammalJuvenileSurvivalMedianQuoted.diploidLethalEquivalents,
  totalFitnessWild: PUBLISHED_LETHAL_EQUIVALENTS.wildMammalsAndBirdsLifeHistory.diploidLethalEquivalents,
} as const
