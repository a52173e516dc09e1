/**
 * Every result a proposal scenario shows, from the engine (shared/genetics) alone: the
 * single function the workspace calls on each input change, the server's calc route calls for
 * API users and the PDF brief calls for its tables — so the three always agree.
 *
 * What is computed (methods in the files named; wording for users in explanations.ts):
 *   - establishment of each adaptive variant (establishment.ts): diffusion over the copies
 *     distribution Binomial(2k, q) and the releases; exact Wright–Fisher chain at round(Ne)
 *     where round(Ne) ≤ 2000 (exact-start.ts); 2hs and branching values beside it; the range
 *     over the plausible s and h; validity flags; time to establishment;
 *   - F, H and relative fitness with and without the releases (projection.ts);
 *   - effective migrants per generation and the one-migrant rule (migrants.ts);
 *   - the outbreeding-depression screen (Frankham et al. 2011) from the proposal's answers.
 *
 * Pure and synchronous. Cost: well under 50 ms for ordinary schedules when the exact chain
 * is small or cached (bench/proposal-results.bench.ts); the exact chain itself grows as
 * round(Ne)² and is supplied through `options.exactVector` so the browser can run large
 * chains in a worker.
 */
import { exactFixationProbabilities, outbreedingRisk } from '../genetics'
import type { CautionId, OutbreedingQuestion, ScreenAnswer } from '../genetics'
import { variantEstablishment } from './establishment'
import { EXACT_CHAIN_LIMIT } from './exact-start'
import type { ExactVectorProvider } from './exact-start'
import { migrantsSummary, oneMigrantRuleCheck } from './migrants'
import { projectScenario } from './projection'
import { applyRecipientOverrides } from './recipient'
import { releasesBeforeHorizon, scheduleMovesAnimals } from './schedule'
import type { ScenarioResults, ScenarioResultsInput } from './types'

export type { ExactVectorProvider } from './exact-start'

const QUESTIONS: readonly OutbreedingQuestion[] = ['sameSpecies', 'fixedChromosomalDifferences', 'geneFlowWithin500Years', 'similarEnvironments']

/** Options of `computeScenarioResults`. */
export interface ScenarioResultsOptions {
  /**
   * Supplies the exact chain's fixation vector; default: the engine, computed on the spot.
   * Pass null to skip the exact chain (e.g. sensitivity sweeps).
   */
  exactVector?: ExactVectorProvider | null
  /** Largest round(Ne) for the exact chain; default 2000. */
  exactChainLimit?: number
}

/** The engine's exact vector, computed on the spot (server, tests, PDF). */
export const computeExactVector: ExactVectorProvider = chain => exactFixationProbabilities(chain)

function screen(input: ScenarioResultsInput): ScenarioResults['outbreeding'] {
  const answers = input.outbreedingAnswers
  if (!answers) return null
  let answered = 0
  const values = {} as Record<OutbreedingQuestion, ScreenAnswer>
  for (const question of QUESTIONS) {
    const value = answers[question]?.value
    if (value === true || value === false || value === 'unknown') {
      values[question] = value
      if (value !== 'unknown') answered++
    } else {
      values[question] = 'unknown'
    }
  }
  if (QUESTIONS.every(question => answers[question] === undefined)) return null
  return { ...outbreedingRisk(values), answered }
}

function scenarioWarnings(input: ScenarioResultsInput, recipient: ScenarioResults['recipient']): CautionId[] {
  const warnings: CautionId[] = []
  if (recipient.effectiveSize < 10) warnings.push('very-small-effective-size')
  if (recipient.effectiveSize > 2 * recipient.census) warnings.push('effective-size-above-twice-census')
  if (input.outbreedingAnswers && QUESTIONS.some(question => input.outbreedingAnswers?.[question]?.value === 'unknown')) {
    warnings.push('outbreeding-unknown-treated-as-elevated')
  }
  return warnings
}

/**
 * Results of one scenario.
 *
 * @param input.recipient - the recipient's record figures: census N (integer ≥ 1), effective
 *   size Ne (≥ ½), generation time L (years, > 0), starting inbreeding F₀ (in [0, 1));
 *   `inputs.recipientOverrides` replace them field by field
 * @param input.inputs - the scenario inputs (shared/schemas/scenario.ts); schedule null = no action
 * @param input.outbreedingAnswers - the proposal's screen answers (missing → 'unknown'; none → null)
 * @param options - exact-chain provider and limit (see ScenarioResultsOptions)
 * @returns establishment per variant, time to establishment, F/H/fitness projection with and
 *   without the releases, migrants per generation with the rule check, the outbreeding level,
 *   and scenario-wide caution ids
 * @throws RangeError when a recipient figure or the load is outside the engine's domain
 *   (variant inputs outside it are reported per variant in `error` instead)
 * @example computeScenarioResults({
 *   recipient: { census: 99, effectiveSize: 100, generationTimeYears: 2, initialInbreeding: 0 },
 *   inputs: { schedule: { animalsPerEvent: 1, females: 1, males: 0, intervalYears: 5, events: 1 },
 *     variants: [{ name: 'v', sourceFrequency: 1, s: 0.1, sRange: [0.05, 0.2], h: 0.5, hRange: [0.25, 0.75] }],
 *     load: { diploidLethalEquivalents: 12, range: [3.1, 30.3], citation: 'wildMammalsAndBirdsLifeHistory' }, horizonYears: 20 },
 * }).establishment[0].headline
 *   // { probability: 0.17803233000515664, method: 'exact' } (diffusion 0.18126924729564187)
 * @example (same inputs).projection.atHorizon.inbreedingWith  // 0.048794758521181536 (no action 0.04888986953422811)
 * @example (schedule: null, the "No action" baseline).establishment  // []
 */
export function computeScenarioResults(input: ScenarioResultsInput, options: ScenarioResultsOptions = {}): ScenarioResults {
  const { inputs } = input
  const recipient = applyRecipientOverrides(input.recipient, inputs.recipientOverrides)
  const schedule = scheduleMovesAnimals(inputs.schedule) ? inputs.schedule : null
  const projection = projectScenario(recipient, schedule, inputs.load, inputs.horizonYears)
  const releaseYears = releasesBeforeHorizon(schedule, inputs.horizonYears)
  const exactVector = options.exactVector === undefined ? computeExactVector : options.exactVector
  const establishment = schedule
    ? inputs.variants.map((variant, index) => variantEstablishment({
        recipient,
        schedule,
        variant,
        index,
        releaseYears,
        horizonYears: inputs.horizonYears,
        exactVector,
        exactChainLimit: options.exactChainLimit ?? EXACT_CHAIN_LIMIT,
      }))
    : []
  const migrants = migrantsSummary(recipient, schedule)
  return {
    recipient,
    hasRelease: schedule !== null,
    establishment,
    projection,
    migrantsPerGeneration: migrants,
    oneMigrantRule: oneMigrantRuleCheck(migrants),
    outbreeding: screen(input),
    warnings: scenarioWarnings(input, recipient),
  }
}
