/**
 * The method notes shown beside every projected number (the "method" chip of the record page,
 * and the method lines of the PDF brief): formula, assumptions and source of each quantity, and
 * the lethal-equivalent presets with their citations. Wording for cautions comes from the engine
 * (shared/genetics/cautions.ts) — this file only points at it.
 */
import {
  CAUTIONS,
  DEFAULT_DIPLOID_LETHAL_EQUIVALENTS,
  ONE_MIGRANT_PER_GENERATION_RULE,
  PUBLISHED_LETHAL_EQUIVALENTS,
  type CautionId,
} from '../genetics'

/**
 * A citation as people read it: without the engine's evidence markers in brackets
 * ("[abstract]", "[memory — verify]").
 *
 * @example plainCitation('Mills LS, Allendorf FW (1996) … 10:1509–1518 [abstract]')  // 'Mills LS, Allendorf FW (1996) … 10:1509–1518'
 */
export function plainCitation(source: string): string {
  return source.replace(/\s*\[[^\]]*\]/g, '').trim()
}

export interface MethodNote {
  formula: string
  assumptions: string
  citation: string
}

const WRIGHT_1931 = 'Wright S (1931) Evolution in Mendelian populations. Genetics 16:97–159'
const MORTON_CROW_MULLER_1956 = 'Morton NE, Crow JF, Muller HJ (1956) An estimate of the mutational damage in man from data on consanguineous marriages. PNAS 42:855–863'

/** Notes for the projected quantities and the conversions behind them. */
export const PROJECTION_METHOD_NOTES = {
  generations: {
    formula: 'generations = years / generation time',
    assumptions: 'Generation time is the mean age of parents when young are born, taken from the record and held constant. The migration model runs in whole generations, so points fall on whole generations.',
    citation: 'Standard definition of generation length (engine: generationsFromYears)',
  },
  inbreeding: {
    formula: 'Isolated: F_t = 1 − (1 − 1/(2Ne))^t.  With gene flow: F_t = (1 − m)²·[1/(2Ne) + (1 − 1/(2Ne))·F_(t−1)]',
    assumptions: `F is measured from today (today's F taken as 0), at a constant working Ne. ${CAUTIONS['island-model-assumptions'].text}`,
    citation: `${WRIGHT_1931} (island model)`,
  },
  heterozygosity: {
    formula: 'H_t / H_today = 1 − F_t',
    assumptions: 'Expected heterozygosity at neutral loci as a share of today’s; the same drift model as F.',
    citation: WRIGHT_1931,
  },
  fitness: {
    formula: 'W / W₀ = exp(−B·F), B = lethal equivalents per gamete = (diploid 2B) ÷ 2',
    assumptions: `Multiplicative effects across loci, no purging, same environment; 2B is the diploid number of lethal equivalents chosen above. ${CAUTIONS['rescue-prediction-limits'].text}`,
    citation: MORTON_CROW_MULLER_1956,
  },
  migrants: {
    formula: 'm = (effective migrants per generation) / Ne',
    assumptions: 'Migrants count genes that enter the breeding pool: translocated animals that do not breed add nothing. One to ten effective migrants per generation is the usual rule of thumb.',
    citation: plainCitation(ONE_MIGRANT_PER_GENERATION_RULE.source),
  },
} as const satisfies Record<string, MethodNote>

/** Lethal-equivalent presets offered with the projections (diploid, 2B). */
export const LETHAL_EQUIVALENT_PRESETS = [
  {
    key: 'totalFitnessWild',
    label: `Whole life in the wild — ${DEFAULT_DIPLOID_LETHAL_EQUIVALENTS.totalFitnessWild}`,
    value: DEFAULT_DIPLOID_LETHAL_EQUIVALENTS.totalFitnessWild,
    citation: plainCitation(PUBLISHED_LETHAL_EQUIVALENTS.wildMammalsAndBirdsLifeHistory.source),
  },
  {
    key: 'juvenileSurvival',
    label: `Juvenile survival only — ${DEFAULT_DIPLOID_LETHAL_EQUIVALENTS.juvenileSurvival}`,
    value: DEFAULT_DIPLOID_LETHAL_EQUIVALENTS.juvenileSurvival,
    citation: plainCitation(PUBLISHED_LETHAL_EQUIVALENTS.captiveMammalJuvenileSurvivalMedianQuoted.source),
  },
] as const

/** Engine cautions shown with every projection, in reading order. */
export const PROJECTION_CAUTION_IDS: readonly CautionId[] = [
  'generations-not-years',
  'per-generation-effective-size',
  'island-model-assumptions',
  'lethal-equivalents-ploidy',
  'rescue-prediction-limits',
]

/** The caution every result that could lead someone to move animals carries. */
export const DECISION_SUPPORT_CAUTION = 'These projections are decision support, not a decision. Agency policy, permits and licensed practice govern any translocation.'
