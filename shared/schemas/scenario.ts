/**
 * A scenario of a proposal as forms and routes accept it — one schema for both:
 *   - ScenarioInputsSchema: the inputs the engine needs (schedule, variants, load, overrides,
 *     horizon); stored as `scenarios.inputs` (JSONB);
 *   - ScenarioCreateSchema: POST /api/proposals/:id/scenarios;
 *   - ScenarioPatchSchema: PATCH /api/scenarios/:id (any subset + `version`).
 *
 * The "No action" baseline: every proposal has exactly one scenario with `isBaseline = true`
 * whose `inputs.schedule` is **null** (no animals are moved). A null schedule is accepted
 * only for the baseline: ScenarioCreateSchema refuses it, and the server refuses it on a
 * PATCH of an ordinary scenario. The baseline itself can only change `inputs.horizonYears`
 * (the server answers 409 otherwise) and cannot be deleted.
 *
 * Units: years for intervals, first event and horizon; animals for the schedule; s and h are
 * per generation and unitless (fitnesses AA = 1 + s, Aa = 1 + h·s, aa = 1); lethal
 * equivalents are diploid (2B, per individual — SCIENCE.md §6.1).
 */
import { z } from 'zod'
import { CAPTIVE_MAMMAL_LETHAL_EQUIVALENT_RANGE, PUBLISHED_LETHAL_EQUIVALENTS } from '../genetics/load/lethal-equivalents'
import { RecordVersionSchema } from './subpopulation'

/** Limits of the scenario inputs (the messages name them). */
export const SCENARIO_LIMITS = {
  name: 120,
  variantName: 120,
  variants: 5,
  animalsPerEvent: 500,
  intervalYears: 50,
  events: 50,
  firstEventYear: 500,
  /** |s| bound above; s must also be > −1 (AA fitness positive). */
  selectionCoefficient: 10,
  /** |h| bound. */
  dominance: 10,
  diploidLethalEquivalents: 50,
  horizonYears: 500,
  overrideCensus: 10_000_000,
  overrideEffectiveSize: 10_000_000,
  overrideGenerationTimeYears: 100,
} as const

/** Default horizon of a new scenario, years. */
export const DEFAULT_HORIZON_YEARS = 50

/**
 * Ids a load's `citation` may take: a key of the engine's PUBLISHED_LETHAL_EQUIVALENTS, or
 * 'custom' for the team's own figure (shown without a published source).
 */
export const LOAD_CITATIONS = [...Object.keys(PUBLISHED_LETHAL_EQUIVALENTS) as (keyof typeof PUBLISHED_LETHAL_EQUIVALENTS)[], 'custom'] as const
export type LoadCitation = typeof LOAD_CITATIONS[number]

const finite = (label: string) => z.number({ error: `${label} must be a number.` }).refine(Number.isFinite, `${label} must be a finite number.`)
const wholeNumber = (label: string) => z.number({ error: `${label} must be a whole number.` }).int(`${label} must be a whole number.`)

const NameSchema = z.string({ error: 'Enter a name.' }).trim()
  .min(1, 'Enter a name.')
  .max(SCENARIO_LIMITS.name, `The name has at most ${SCENARIO_LIMITS.name} characters.`)

/** A [low, high] plausible range; low ≤ high. */
const rangeSchema = (label: string, value: z.ZodType<number>) => z.tuple([value, value], { error: `${label.charAt(0).toUpperCase()}${label.slice(1)} must be a pair [low, high].` })
  .refine(([low, high]) => low <= high, `The low end of ${label} must not exceed the high end.`)

/**
 * One release schedule: `events` releases of `animalsPerEvent` animals (females + males),
 * every `intervalYears` years, the first at `firstEventYear` (years from now, default 0).
 */
export const ScheduleSchema = z.strictObject({
  animalsPerEvent: wholeNumber('Animals per release')
    .min(1, 'Move at least 1 animal per release.')
    .max(SCENARIO_LIMITS.animalsPerEvent, `Animals per release must be at most ${SCENARIO_LIMITS.animalsPerEvent}.`),
  females: wholeNumber('The number of females').min(0, 'The number of females cannot be negative.'),
  males: wholeNumber('The number of males').min(0, 'The number of males cannot be negative.'),
  intervalYears: finite('The interval')
    .refine(value => value > 0, 'The interval must be more than 0 years.')
    .refine(value => value <= SCENARIO_LIMITS.intervalYears, `The interval must be at most ${SCENARIO_LIMITS.intervalYears} years.`),
  events: wholeNumber('The number of releases')
    .min(1, 'Plan at least 1 release.')
    .max(SCENARIO_LIMITS.events, `Plan at most ${SCENARIO_LIMITS.events} releases.`),
  firstEventYear: finite('The first release year')
    .refine(value => value >= 0, 'The first release cannot be in the past (year ≥ 0).')
    .refine(value => value <= SCENARIO_LIMITS.firstEventYear, `The first release must be within ${SCENARIO_LIMITS.firstEventYear} years.`)
    .default(0),
}).superRefine((value, context) => {
  if (value.females + value.males !== value.animalsPerEvent) {
    context.addIssue({ code: 'custom', path: ['males'], message: `Females and males must add up to the animals per release (${value.animalsPerEvent}).` })
  }
})
export type Schedule = z.output<typeof ScheduleSchema>

const SelectionSchema = finite('s')
  .refine(value => value > -1, 's must be more than −1 (the AA fitness 1 + s must stay positive).')
  .refine(value => value <= SCENARIO_LIMITS.selectionCoefficient, `s must be at most ${SCENARIO_LIMITS.selectionCoefficient}.`)
const DominanceSchema = finite('h')
  .refine(value => Math.abs(value) <= SCENARIO_LIMITS.dominance, `h must be between −${SCENARIO_LIMITS.dominance} and ${SCENARIO_LIMITS.dominance}.`)

/**
 * An adaptive variant carried by the source: its frequency there (0 < p ≤ 1), selection
 * coefficient s and dominance h, each with a plausible range [low, high] that contains the
 * value. Every corner of the ranges keeps the Aa fitness 1 + h·s positive.
 */
export const VariantSchema = z.strictObject({
  name: z.string({ error: 'Name the variant.' }).trim()
    .min(1, 'Name the variant.')
    .max(SCENARIO_LIMITS.variantName, `The variant name has at most ${SCENARIO_LIMITS.variantName} characters.`),
  sourceFrequency: finite('The frequency in the source')
    .refine(value => value > 0 && value <= 1, 'The frequency in the source must be more than 0 and at most 1.'),
  s: SelectionSchema,
  sRange: rangeSchema('the s range', SelectionSchema),
  h: DominanceSchema,
  hRange: rangeSchema('the h range', DominanceSchema),
}).superRefine((value, context) => {
  const [sLow, sHigh] = value.sRange
  const [hLow, hHigh] = value.hRange
  if (value.s < sLow || value.s > sHigh) context.addIssue({ code: 'custom', path: ['sRange'], message: `The s range must contain s (${value.s}).` })
  if (value.h < hLow || value.h > hHigh) context.addIssue({ code: 'custom', path: ['hRange'], message: `The h range must contain h (${value.h}).` })
  // 1 + h·s is bilinear in (h, s): its minimum over the rectangle is at a corner.
  const corners: [number, number][] = [[hLow, sLow], [hLow, sHigh], [hHigh, sLow], [hHigh, sHigh], [value.h, value.s]]
  if (corners.some(([h, s]) => !(1 + h * s > 0))) {
    context.addIssue({ code: 'custom', path: ['hRange'], message: 'Every combination of h and s in their ranges must keep the heterozygote fitness 1 + h·s above 0.' })
  }
})
export type Variant = z.output<typeof VariantSchema>

const LethalEquivalentSchema = finite('Lethal equivalents')
  .refine(value => value >= 0, 'Lethal equivalents cannot be negative.')
  .refine(value => value <= SCENARIO_LIMITS.diploidLethalEquivalents, `Lethal equivalents must be at most ${SCENARIO_LIMITS.diploidLethalEquivalents}.`)

/** Inbreeding-load assumption: diploid lethal equivalents (2B), its range and its source. */
export const LoadSchema = z.strictObject({
  diploidLethalEquivalents: LethalEquivalentSchema,
  range: rangeSchema('the lethal-equivalent range', LethalEquivalentSchema),
  citation: z.enum(LOAD_CITATIONS, { error: `Choose the source of the lethal equivalents (${LOAD_CITATIONS.join(', ')}).` }),
}).superRefine((value, context) => {
  const [low, high] = value.range
  if (value.diploidLethalEquivalents < low || value.diploidLethalEquivalents > high) {
    context.addIssue({ code: 'custom', path: ['range'], message: `The range must contain the lethal equivalents (${value.diploidLethalEquivalents}).` })
  }
})
export type Load = z.output<typeof LoadSchema>

/** What-if overrides of the recipient's record (each optional; absent = use the record). */
export const RecipientOverridesSchema = z.strictObject({
  census: wholeNumber('The census')
    .min(1, 'The census must be at least 1 animal.')
    .max(SCENARIO_LIMITS.overrideCensus, `The census must be at most ${SCENARIO_LIMITS.overrideCensus.toLocaleString('en-US')}.`)
    .optional(),
  effectiveSize: finite('The effective size')
    .refine(value => value > 0, 'The effective size must be more than 0 individuals.')
    .refine(value => value <= SCENARIO_LIMITS.overrideEffectiveSize, `The effective size must be at most ${SCENARIO_LIMITS.overrideEffectiveSize.toLocaleString('en-US')}.`)
    .optional(),
  generationTimeYears: finite('The generation time')
    .refine(value => value > 0, 'The generation time must be more than 0 years.')
    .refine(value => value <= SCENARIO_LIMITS.overrideGenerationTimeYears, `The generation time must be at most ${SCENARIO_LIMITS.overrideGenerationTimeYears} years.`)
    .optional(),
  initialInbreeding: finite('The initial inbreeding')
    .refine(value => value >= 0 && value < 1, 'The initial inbreeding F must be at least 0 and less than 1.')
    .optional(),
})
export type RecipientOverrides = z.output<typeof RecipientOverridesSchema>

/**
 * Everything the engine needs for one scenario. `schedule` is null only for the "No action"
 * baseline (see the file comment).
 */
export const ScenarioInputsSchema = z.strictObject({
  schedule: ScheduleSchema.nullable(),
  sourceSubpopulationId: wholeNumber('The source').positive('Choose a source.').max(2_147_483_647, 'Choose a source.').nullable(),
  variants: z.array(VariantSchema, { error: 'Variants must be a list.' })
    .max(SCENARIO_LIMITS.variants, `At most ${SCENARIO_LIMITS.variants} variants per scenario.`),
  load: LoadSchema,
  recipientOverrides: RecipientOverridesSchema.optional(),
  horizonYears: finite('The horizon')
    .refine(value => value >= 1, 'The horizon must be at least 1 year.')
    .refine(value => value <= SCENARIO_LIMITS.horizonYears, `The horizon must be at most ${SCENARIO_LIMITS.horizonYears} years.`)
    .default(DEFAULT_HORIZON_YEARS),
})
export type ScenarioInputsInput = z.input<typeof ScenarioInputsSchema>
export type ScenarioInputs = z.output<typeof ScenarioInputsSchema>

/** Inputs of an ordinary (non-baseline) scenario: a schedule is required. */
const ActionInputsSchema = ScenarioInputsSchema.superRefine((value, context) => {
  if (value.schedule === null) {
    context.addIssue({ code: 'custom', path: ['schedule'], message: 'Give a release schedule; only the "No action" baseline has none.' })
  }
})

/** POST /api/proposals/:id/scenarios */
export const ScenarioCreateSchema = z.strictObject({
  name: NameSchema,
  inputs: ActionInputsSchema,
})
export type ScenarioCreateInput = z.input<typeof ScenarioCreateSchema>

/**
 * PATCH /api/scenarios/:id: a new name and/or complete new inputs, with the `version` the
 * change is based on. For the baseline only `inputs.horizonYears` may differ (409 otherwise).
 */
export const ScenarioPatchSchema = z.strictObject({
  name: NameSchema.optional(),
  inputs: ScenarioInputsSchema.optional(),
  version: RecordVersionSchema,
})
export type ScenarioPatchInput = z.input<typeof ScenarioPatchSchema>

/** DELETE /api/scenarios/:id[?version=N] — the version is optional; a stale one answers 409. */
export const ScenarioDeleteQuerySchema = z.object({
  version: z.string({ error: 'Send the version you loaded (?version=N).' })
    .regex(/^\d{1,10}$/, 'Send the version you loaded (?version=N).')
    .transform(Number)
    .pipe(RecordVersionSchema)
    .optional(),
})

/**
 * Cited default load: 2B = 12 for total fitness in the wild (O'Grady et al. 2006), range from
 * the Ralls et al. (1988) median 3.1 to the top of their range 30.3 (SCIENCE.md §6.1).
 */
export function defaultLoad(): Load {
  return {
    diploidLethalEquivalents: PUBLISHED_LETHAL_EQUIVALENTS.wildMammalsAndBirdsLifeHistory.diploidLethalEquivalents,
    range: [PUBLISHED_LETHAL_EQUIVALENTS.captiveMammalJuvenileSurvivalMedian.diploidLethalEquivalents, CAPTIVE_MAMMAL_LETHAL_EQUIVALENT_RANGE.high],
    citation: 'wildMammalsAndBirdsLifeHistory',
  }
}

/** Inputs of the "No action" baseline: no schedule, no variants, the cited default load. */
export function baselineScenarioInputs(horizonYears: number = DEFAULT_HORIZON_YEARS): ScenarioInputs {
  return { schedule: null, sourceSubpopulationId: null, variants: [], load: defaultLoad(), horizonYears }
}

/**
 * A placeholder adaptive variant for a new scenario, so that establishment results show from
 * the start: common in the source (p = 0.5), mildly favoured (s = 0.05, range 0.01–0.1),
 * additive (h = 0.5, range 0.1–0.9). Illustrative values, common practice, no source — the
 * biologist replaces them with the variant they care about.
 */
export function exampleVariant(): Variant {
  return { name: 'Example adaptive variant (replace)', sourceFrequency: 0.5, s: 0.05, sRange: [0.01, 0.1], h: 0.5, hRange: [0.1, 0.9] }
}

/**
 * Inputs of the first scenario a new proposal gets: 4 animals (2 females, 2 males) every
 * 5 years, 3 releases from year 0, the example variant, the cited default load and a 50-year
 * horizon. The schedule is a starting point to edit, not a recommendation.
 */
export function defaultScenarioInputs(sourceSubpopulationId: number | null): ScenarioInputs {
  return {
    schedule: { animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 0 },
    sourceSubpopulationId,
    variants: [exampleVariant()],
    load: defaultLoad(),
    horizonYears: DEFAULT_HORIZON_YEARS,
  }
}

/** Name of the automatic baseline scenario. */
export const BASELINE_SCENARIO_NAME = 'No action'
/** Name of the first scenario of a new proposal. */
export const FIRST_SCENARIO_NAME = 'Scenario A'

/** One scenario as the routes return it. Dates are ISO 8601 strings. */
export interface ScenarioDto {
  id: number
  proposalId: number
  name: string
  isBaseline: boolean
  inputs: ScenarioInputs
  createdAt: string
  updatedAt: string
  /** Send back with PATCH (optimistic locking). */
  version: number
}

/** GET /api/proposals/:id/scenarios */
export interface ScenarioListResponse { items: ScenarioDto[] }

/** Most migrants per event the establishment calculation averages over. */
export const MAXIMUM_CALC_MIGRANTS = 500

const calcNumber = (label: string) => z.number({ error: `${label} must be a number.` }).refine(Number.isFinite, `${label} must be a finite number.`)

/**
 * POST /api/calc/establishment — establishment of an introduced allele, for API users.
 * Either `copies` (k gene copies in a population of `census` diploids, the engine's own
 * inputs) or `migrantsPerEvent` with `sourceFrequency` (one release of m animals from a source
 * where the variant has frequency q into `census` residents: the copies follow
 * Binomial(2m, q), start at frequency j/(2(census + m)) and every result is the average over
 * them — the proposal workspace's computation for one release). Only the shape is checked
 * here; the engine checks the domain (census an integer ≥ 1, Ne > 0, 1 + s > 0, 1 + h·s > 0,
 * 0 ≤ copies ≤ 2·census …) and its RangeError comes back as 422 naming the parameter.
 */
export const EstablishmentCalcSchema = z.strictObject({
  census: calcNumber('census'),
  effectiveSize: calcNumber('effectiveSize'),
  s: calcNumber('s'),
  h: calcNumber('h'),
  copies: calcNumber('copies').optional(),
  migrantsPerEvent: wholeNumber('migrantsPerEvent')
    .min(1, 'migrantsPerEvent must be at least 1.')
    .max(MAXIMUM_CALC_MIGRANTS, `migrantsPerEvent must be at most ${MAXIMUM_CALC_MIGRANTS}.`)
    .optional(),
  sourceFrequency: calcNumber('sourceFrequency')
    .refine(value => value > 0 && value <= 1, 'sourceFrequency must be more than 0 and at most 1.')
    .optional(),
}).superRefine((value, context) => {
  const byCopies = value.copies !== undefined
  const byMigrants = value.migrantsPerEvent !== undefined || value.sourceFrequency !== undefined
  if (byCopies && byMigrants) {
    context.addIssue({ code: 'custom', path: ['copies'], message: 'Send either copies, or migrantsPerEvent with sourceFrequency — not both.' })
  } else if (!byCopies && !byMigrants) {
    context.addIssue({ code: 'custom', path: ['copies'], message: 'Send copies, or migrantsPerEvent with sourceFrequency.' })
  } else if (byMigrants) {
    if (value.migrantsPerEvent === undefined) context.addIssue({ code: 'custom', path: ['migrantsPerEvent'], message: 'Send migrantsPerEvent with sourceFrequency.' })
    if (value.sourceFrequency === undefined) context.addIssue({ code: 'custom', path: ['sourceFrequency'], message: 'Send sourceFrequency with migrantsPerEvent.' })
  }
})
export type EstablishmentCalcInput = z.input<typeof EstablishmentCalcSchema>

/** A caution as the calc route returns it (shared/genetics/cautions.ts `Caution`). */
export interface CalcCautionDto { id: string, title: string, text: string, source: string }

/**
 * POST /api/calc/establishment → 200. Probabilities in [0, 1]. With `migrantsPerEvent` every
 * figure is the average over the copies one release carries (`copies.distribution`).
 */
export interface EstablishmentCalcResponse {
  inputs: { census: number, effectiveSize: number, s: number, h: number, copies: number | null, migrantsPerEvent: number | null, sourceFrequency: number | null }
  copies:
    | { mode: 'fixed', copies: number }
    | { mode: 'binomial', distribution: { geneCopies: number, sourceFrequency: number, mean: number, probabilityNone: number, terms: { copies: number, probability: number }[] } }
  /** Kimura's diffusion (Kimura 1962) — the headline figure unless `exact` is given. */
  diffusion: { probability: number, /** null when the probability is exactly 0 (no copies). */ log10Probability: number | null }
  /**
   * The exact Wright–Fisher chain; null when it does not apply (`exactNote` says why). With
   * `copies`: the chain of `census` individuals, only when Ne = census ≤ 2000. With migrants:
   * the workspace's chain of round(Ne) ≤ 2000 individuals started from the released copies.
   */
  exact: { probability: number } | null
  exactNote: string
  /** Haldane's 2hs with Kimura's Ne/N factor (`saturating` is the probability form); null for 0 copies. */
  haldane: { linear: number, saturating: number, withinValidity: boolean, relativeErrorVsDiffusion: number | null } | null
  /** Branching-process survival (large population): 1 − (1 − π)^k, averaged over k. */
  branching: { probability: number }
  /** Cautions that apply to these inputs (fixationMethodWarnings, plus 'rule-of-thumb-only' when 2hs is outside its validity). */
  warnings: CalcCautionDto[]
  /** Cautions shown with every establishment probability. */
  cautions: CalcCautionDto[]
}
