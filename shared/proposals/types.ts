/**
 * Shapes of the proposal results: what `computeScenarioResults` reads and returns.
 *
 * Read by shared/proposals/*.ts, the proposal workspace (components/proposal, composables),
 * the server's calc route and the PDF brief. The input side is structural, so a stored
 * `ScenarioInputs` (shared/schemas/scenario.ts) is accepted as it is; tests/unit/proposals
 * checks that the schema's type stays assignable to it.
 *
 * Units: census and effective size in individuals, times in years unless a field says
 * generations, probabilities in [0, 1]; s and h per generation (fitnesses AA = 1 + s,
 * Aa = 1 + h·s, aa = 1), lethal equivalents diploid (2B).
 */
import type { CautionId, OutbreedingQuestion, OutbreedingRiskResult, ScreenAnswer } from '../genetics'

/** A [low, high] plausible range. */
export type Range = readonly [number, number]

/** The recipient figures the results use (after what-if overrides). */
export interface RecipientFigures {
  /** N, census of breeding adults, integer ≥ 1. */
  census: number
  /** Ne per generation, individuals, ≥ ½. */
  effectiveSize: number
  /** L, years per generation, > 0. */
  generationTimeYears: number
  /** F today relative to the founding base, in [0, 1). */
  initialInbreeding: number
}

/** A release schedule; null (or zero events) means no animals are moved. */
export interface ScheduleLike {
  animalsPerEvent: number
  females: number
  males: number
  intervalYears: number
  events: number
  firstEventYear?: number
}

/** An adaptive variant carried by the source. */
export interface VariantLike {
  name: string
  /** q, frequency of the variant in the source, in (0, 1]. */
  sourceFrequency: number
  s: number
  sRange: Range
  h: number
  hRange: Range
}

/** The inbreeding-load assumption. */
export interface LoadLike {
  /** 2B, diploid lethal equivalents, ≥ 0. */
  diploidLethalEquivalents: number
  range: Range
  citation: string
}

/** Scenario inputs as stored (shared/schemas/scenario.ts `ScenarioInputs`). */
export interface ScenarioInputsLike {
  schedule: ScheduleLike | null
  sourceSubpopulationId?: number | null
  variants: readonly VariantLike[]
  load: LoadLike
  recipientOverrides?: Partial<RecipientFigures>
  horizonYears: number
}

/** One answer of the outbreeding screen as stored on a proposal. */
export interface OutbreedingAnswerLike { value: ScreenAnswer }

/** What `computeScenarioResults` needs. */
export interface ScenarioResultsInput {
  /** The recipient's record figures; `inputs.recipientOverrides` replace them field by field. */
  recipient: RecipientFigures
  inputs: ScenarioInputsLike
  /** The proposal's outbreeding-screen answers; missing questions count as 'unknown'. */
  outbreedingAnswers?: Partial<Record<OutbreedingQuestion, OutbreedingAnswerLike>> | null
}

/** P(j) for the number of variant copies one release carries. */
export interface CopiesDistribution {
  /** 2k, gene copies carried by the k animals of one release. */
  geneCopies: number
  /** q, the source frequency. */
  sourceFrequency: number
  /** Mean copies 2k·q. */
  mean: number
  /** P(no copy at all) = (1 − q)^(2k). */
  probabilityNone: number
  /** Copies j ≥ 1 with P(j) that entered the sum, in increasing j (tails below 10⁻¹⁵ of the sum dropped). */
  terms: { copies: number, probability: number }[]
}

/** The exact chain's part of an establishment result. */
export type ExactEstablishment
  = | {
    status: 'computed'
    /** Establishment probability over all releases (same event combination as the diffusion). */
    probability: number
    /** One release. */
    singleRelease: number
    /** M = round(Ne), the Wright–Fisher population size of the chain. */
    chainSize: number
    /** (diffusion − exact) / exact over all releases; null when exact is 0. */
    diffusionRelativeDifference: number | null
  }
  | { status: 'pending', chainSize: number }
  | { status: 'not-applicable', reason: string }

/** Haldane's 2hs (with Kimura's Ne/N) beside the model value. */
export interface HaldaneBeside {
  /** Saturating form mixed over the copies distribution, over all releases. */
  probability: number
  /** The linear rule of thumb 2·h·s·(Ne/N)·(expected copies) × releases (not capped). */
  linear: number
  /** (2hs − headline) / headline; null when the headline is 0. */
  relativeError: number | null
  /** The engine's validity rule (h > 0, 4·Ne·h·s ≥ 10, s ≤ 0.05). */
  withinValidity: boolean
}

/** Establishment of one variant. */
export interface VariantEstablishment {
  name: string
  /** Index of the variant in `inputs.variants`. */
  index: number
  /** Set when the inputs are outside the engine's domain; every number below is then 0/null. */
  error: string | null
  /** Diffusion (Kimura 1962) over the copies distribution and the releases. */
  diffusion: { probability: number, singleRelease: number, log10Probability: number }
  exact: ExactEstablishment
  /** The headline figure and which method gave it. */
  headline: { probability: number, method: 'diffusion' | 'exact' | 'no-release' }
  /** Diffusion at the corners of the s and h plausible ranges: [lowest, highest]. */
  range: { low: number, high: number }
  haldane: HaldaneBeside
  /** Branching-process survival (large population, Ne = N), mixed over copies and releases. */
  branching: { probability: number }
  copiesDistribution: CopiesDistribution
  /** Releases counted (those before the horizon). */
  releasesCounted: number
  /** Caution ids (shared/genetics/cautions.ts) for this variant's figures. */
  warnings: CautionId[]
  /** Kimura–Ohta mean time to fixation given establishment; null when it cannot establish. */
  time: TimeToEstablishment | null
}

/** Expected time to establishment (fixation), given that the variant establishes. */
export interface TimeToEstablishment {
  /** Mean generations from the release that establishes it. */
  generations: number
  years: number
  /** Adds the expected wait for that release, counted from the first release. */
  fromFirstReleaseGenerations: number
  fromFirstReleaseYears: number
  /** True when `fromFirstReleaseYears` runs past the horizon. */
  beyondHorizon: boolean
}

/** F, H and fitness series over the horizon, one point per whole generation. */
export interface ProjectionSeries {
  inbreeding: number[]
  /** Heterozygosity relative to today, (1 − F_t)/(1 − F_0). */
  heterozygosity: number[]
  /** exp(−B·F_t) with the load's 2B. */
  fitness: number[]
  /** Fitness with the low and high ends of the load range. */
  fitnessLow: number[]
  fitnessHigh: number[]
}

/** One release as it enters the projection. */
export interface ReleaseStep {
  year: number
  /** Generation whose parents include the released animals (1-based step). */
  generation: number
  animals: number
}

export interface ScenarioProjection {
  generations: number[]
  years: number[]
  withAction: ProjectionSeries
  withoutAction: ProjectionSeries
  releases: ReleaseStep[]
  /** Releases scheduled at or after the horizon (not in the projection). */
  releasesAfterHorizon: number
  /** Summary at the last whole generation. */
  atHorizon: {
    years: number
    inbreedingWith: number
    inbreedingWithout: number
    fitnessWith: number
    fitnessWithout: number
    /** W with / W without (rescueFitnessRatio). */
    fitnessRatio: number
  }
}

/** Gene flow on the scale of the one-migrant-per-generation rule. */
export interface MigrantsSummary {
  /** Animals released per generation while releases continue. */
  animalsPerGeneration: number
  /** m, share of breeding genes from released animals per generation. */
  migrationRate: number
  /** Ne·m, effective migrants per generation. */
  effectiveMigrants: number
  /** One release only: the rule is about continuing gene flow. */
  oneOff: boolean
}

export interface OneMigrantRuleCheck {
  value: number
  minimum: number
  maximum: number
  meets: boolean
  aboveMaximum: boolean
}

export interface ScenarioResults {
  /** The recipient figures used (record with overrides applied). */
  recipient: RecipientFigures
  /** False for the "No action" baseline or a schedule that moves nobody. */
  hasRelease: boolean
  establishment: VariantEstablishment[]
  projection: ScenarioProjection
  migrantsPerGeneration: MigrantsSummary
  oneMigrantRule: OneMigrantRuleCheck
  /** Null when no answer is stored (the screen is not started). */
  outbreeding: (OutbreedingRiskResult & { answered: number }) | null
  /** Caution ids for the whole scenario (recipient, load, migration). */
  warnings: CautionId[]
}
