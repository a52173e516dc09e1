/**
 * Effective-size estimates of a subpopulation (server/api/subpopulations/[id]/effective-sizes/**,
 * …/working-ne) and the estimator forms of the record page.
 *
 * An estimate is posted as `{ method, inputs }` only: the value and its interval are computed
 * by `computeEffectiveSizeEstimate` — in the browser for the live result, and again on the
 * server, which stores what it computed (a posted `value` is refused). The computation calls
 * the engine (shared/genetics/effective-size) and nothing else, so the two always agree.
 *
 * Read by: the estimator components (components/subpopulation/SubpopulationEffectiveSize*.vue),
 * the routes, and the unit tests (tests/unit/subpopulation/effective-size-schema.test.ts).
 */
import { z } from 'zod'
import {
  effectiveSizeFromFamilyVariance,
  effectiveSizeFromRatio,
  effectiveSizeFromSexRatio,
  effectiveSizeHarmonicMean,
  MINIMUM_EFFECTIVE_SIZE,
  NE_TO_CENSUS_RATIO_DEFAULT,
} from '../genetics'
import type { EffectiveSizeMethod } from '../types/db'
import { CensusYearSchema } from './census'
import { VersionSchema } from './users'

/** Methods the app computes itself (the other EFFECTIVE_SIZE_METHODS are recorded from elsewhere). */
export const COMPUTED_EFFECTIVE_SIZE_METHODS = ['sex-ratio', 'harmonic-mean', 'family-size-variance', 'ne-n-ratio'] as const
export type ComputedEffectiveSizeMethod = typeof COMPUTED_EFFECTIVE_SIZE_METHODS[number]

/** Largest figure accepted in any estimator input (animals or offspring²). */
const MAX_INPUT = 100_000_000

function positiveNumber(what: string) {
  return z.number({ error: `${what} must be a number greater than 0.` })
    .gt(0, `${what} must be greater than 0.`)
    .max(MAX_INPUT, `${what} must be at most ${MAX_INPUT.toLocaleString('en-GB')}.`)
}

/** Sex ratio: breeding males and females of one generation (averages allowed). */
export const SexRatioInputsSchema = z.strictObject({
  males: positiveNumber('Breeding males'),
  females: positiveNumber('Breeding females'),
  /** The census year the numbers come from, when they do. */
  year: CensusYearSchema.optional(),
})

/** Harmonic mean: the census years to use; the adults of those years are read from the census. */
export const HarmonicMeanInputsSchema = z.strictObject({
  years: z.array(CensusYearSchema, { error: 'Choose the census years to use.' })
    .min(2, 'Choose at least two census years.')
    .max(500, 'Choose at most 500 years.')
    .refine(years => new Set(years).size === years.length, 'Each year may be chosen once.'),
})

/** Family-size variance: breeding adults and the variance of their lifetime offspring numbers. */
export const FamilyVarianceInputsSchema = z.strictObject({
  census: z.number({ error: 'Breeding adults must be a number, 1 or more.' })
    .min(1, 'Breeding adults must be at least 1.')
    .max(MAX_INPUT, `Breeding adults must be at most ${MAX_INPUT.toLocaleString('en-GB')}.`),
  familySizeVariance: z.number({ error: 'The variance must be a number, 0 or more.' })
    .min(0, 'The variance cannot be negative.')
    .max(1_000_000, 'The variance must be at most 1,000,000.'),
  censusYear: CensusYearSchema.optional(),
})

const ratioNumber = (what: string) => z.number({ error: `${what} must be a number greater than 0.` })
  .gt(0, `${what} must be greater than 0.`)
  .max(2, `${what} must be at most 2 (Ne can reach about twice N only with equalised family sizes).`)

/** Ne/N ratio: a census count and an assumed ratio with the range that brackets it. */
export const RatioInputsSchema = z.strictObject({
  census: positiveNumber('The census count'),
  ratio: ratioNumber('The ratio'),
  ratioLow: ratioNumber('The low end of the range'),
  ratioHigh: ratioNumber('The high end of the range'),
  censusYear: CensusYearSchema.optional(),
}).superRefine((inputs, context) => {
  if (inputs.ratioLow > inputs.ratio) context.addIssue({ code: 'custom', path: ['ratioLow'], message: 'The low end must not be above the ratio.' })
  if (inputs.ratioHigh < inputs.ratio) context.addIssue({ code: 'custom', path: ['ratioHigh'], message: 'The high end must not be below the ratio.' })
})

/** Where the inputs come from (report, survey, person); the server writes a default when empty. */
const SourceSchema = z.string({ error: 'The source must be text.' }).trim().max(500, 'The source has at most 500 characters.')

/** A calendar date, YYYY-MM-DD. */
const DateOnlySchema = z.string({ error: 'Enter a date like 2025-03-01.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter a date like 2025-03-01.')
  .refine(text => !Number.isNaN(Date.parse(`${text}T00:00:00Z`)) && new Date(`${text}T00:00:00Z`).toISOString().startsWith(text), 'Enter a real date, like 2025-03-01.')

const common = { source: SourceSchema.optional(), estimatedOn: DateOnlySchema.optional() }

/**
 * POST /api/subpopulations/:id/effective-sizes. Strict: a `value` (or any other unknown field)
 * is refused, because the server computes the value itself.
 */
export const EffectiveSizeCreateSchema = z.discriminatedUnion('method', [
  z.strictObject({ method: z.literal('sex-ratio'), inputs: SexRatioInputsSchema, ...common }),
  z.strictObject({ method: z.literal('harmonic-mean'), inputs: HarmonicMeanInputsSchema, ...common }),
  z.strictObject({ method: z.literal('family-size-variance'), inputs: FamilyVarianceInputsSchema, ...common }),
  z.strictObject({ method: z.literal('ne-n-ratio'), inputs: RatioInputsSchema, ...common }),
], { error: `Choose a method: ${COMPUTED_EFFECTIVE_SIZE_METHODS.join(', ')}.` })
export type EffectiveSizeCreateInput = z.infer<typeof EffectiveSizeCreateSchema>

/** Method and inputs of a POST, without the optional fields (kept as a union per method). */
export type EffectiveSizeRequest = EffectiveSizeCreateInput extends infer Each
  ? Each extends { method: infer Method, inputs: infer Inputs } ? { method: Method, inputs: Inputs } : never
  : never

/**
 * What the computation needs: the posted inputs, plus for the harmonic mean the adults of the
 * chosen years (read from the census by the server, or from the loaded table by the page).
 */
export type EffectiveSizeComputation
  = | { method: 'sex-ratio', inputs: z.infer<typeof SexRatioInputsSchema> }
    | { method: 'harmonic-mean', inputs: { years: readonly number[], sizes: readonly number[] } }
    | { method: 'family-size-variance', inputs: z.infer<typeof FamilyVarianceInputsSchema> }
    | { method: 'ne-n-ratio', inputs: z.infer<typeof RatioInputsSchema> }

/** A computed estimate: Ne per generation, and an interval when the method gives one. */
export interface EffectiveSizeResult {
  value: number
  intervalLow: number | null
  intervalHigh: number | null
}

/**
 * Computes an estimate with the engine. The harmonic mean uses the census adults of each chosen
 * year as that generation's size (the assumption the page states).
 *
 * @param computation - method and validated inputs (sizes in the same order as years)
 * @returns value and interval, individuals per generation
 * @throws RangeError from the engine when an input is outside its domain (e.g. a census of 0)
 * @example computeEffectiveSizeEstimate({ method: 'sex-ratio', inputs: { males: 10, females: 40 } }).value  // 32
 * @example computeEffectiveSizeEstimate({ method: 'ne-n-ratio', inputs: { census: 500, ratio: 0.1, ratioLow: 0.05, ratioHigh: 0.3 } })
 *   // { value: 50, intervalLow: 25, intervalHigh: 150 }
 */
export function computeEffectiveSizeEstimate(computation: EffectiveSizeComputation): EffectiveSizeResult {
  switch (computation.method) {
    case 'sex-ratio':
      return { value: effectiveSizeFromSexRatio(computation.inputs), intervalLow: null, intervalHigh: null }
    case 'harmonic-mean':
      return { value: effectiveSizeHarmonicMean(computation.inputs.sizes), intervalLow: null, intervalHigh: null }
    case 'family-size-variance':
      return { value: effectiveSizeFromFamilyVariance(computation.inputs), intervalLow: null, intervalHigh: null }
    case 'ne-n-ratio': {
      const { census, ratio, ratioLow, ratioHigh } = computation.inputs
      return {
        value: effectiveSizeFromRatio({ census, ratio }),
        intervalLow: effectiveSizeFromRatio({ census, ratio: ratioLow }),
        intervalHigh: effectiveSizeFromRatio({ census, ratio: ratioHigh }),
      }
    }
  }
}

/**
 * The source written with an estimate when the person leaves it empty: where the inputs come
 * from, in words.
 *
 * @example defaultEstimateSource({ method: 'sex-ratio', inputs: { males: 10, females: 40, year: 2024 } })  // 'Census 2024: breeding males and females'
 * @example defaultEstimateSource({ method: 'harmonic-mean', inputs: { years: [2015, 2024, 2016] } })       // 'Census 2015–2024: adult counts of 3 years'
 */
export function defaultEstimateSource(input: EffectiveSizeRequest): string {
  switch (input.method) {
    case 'sex-ratio':
      return input.inputs.year === undefined ? 'Breeding males and females entered in Tributary' : `Census ${input.inputs.year}: breeding males and females`
    case 'harmonic-mean': {
      const years = [...input.inputs.years].sort((a, b) => a - b)
      return `Census ${years[0]}–${years[years.length - 1]}: adult counts of ${years.length} years`
    }
    case 'family-size-variance':
      return input.inputs.censusYear === undefined ? 'Family-size data entered in Tributary' : `Census ${input.inputs.censusYear} and family-size data`
    case 'ne-n-ratio': {
      const { ratio, ratioLow, ratioHigh, censusYear } = input.inputs
      const census = censusYear === undefined ? 'Census count entered in Tributary' : `Census ${censusYear}`
      return `${census}; assumed Ne/N ${ratio} (range ${ratioLow}–${ratioHigh})`
    }
  }
}

/** How a method is named and explained beside its result (the "method" note). */
export interface EffectiveSizeMethodInfo {
  label: string
  formula: string
  assumptions: string
  citation: string
}

/** Every known method, including those recorded from elsewhere (genetic estimates). */
export const EFFECTIVE_SIZE_METHOD_INFO: Readonly<Record<EffectiveSizeMethod, EffectiveSizeMethodInfo>> = {
  'sex-ratio': {
    label: 'Sex ratio',
    formula: 'Ne = 4·Nm·Nf / (Nm + Nf)',
    assumptions: 'Random mating within each sex, Poisson family sizes, discrete generations; Nm and Nf are breeding adults. An upper bound when family sizes vary more than by chance.',
    citation: 'Wright S (1931) Evolution in Mendelian populations. Genetics 16:97–159',
  },
  'harmonic-mean': {
    label: 'Harmonic mean over the census',
    formula: 'Ne = t / Σ (1/Nᵢ)',
    assumptions: 'Each census year’s adult count is taken as one generation’s effective size. Annual counts of a species with a generation time above one year, and adults that are not all breeding, both make this an overestimate.',
    citation: 'Wright S (1938) Size of population and breeding structure in relation to evolution. Science 87:430–431',
  },
  'family-size-variance': {
    label: 'Family-size variance',
    formula: 'Ne = (4N − 2) / (Vk + 2)',
    assumptions: 'Stable population size (mean family size 2), N breeding adults, Vk the variance of lifetime offspring numbers reaching breeding age; the result is Ne per generation.',
    citation: 'Wright S (1938); Crow JF, Kimura M (1970) An Introduction to Population Genetics Theory; Crow JF, Denniston C (1988) Evolution 42:482–495',
  },
  'ne-n-ratio': {
    label: 'Ne/N ratio',
    formula: 'Ne = (Ne/N) · N',
    assumptions: `A rough prior from other species, not an estimate for this population. Default ratio ${NE_TO_CENSUS_RATIO_DEFAULT.value} with the range ${NE_TO_CENSUS_RATIO_DEFAULT.low}–${NE_TO_CENSUS_RATIO_DEFAULT.high}; the range is a product default, not a published interval.`,
    citation: NE_TO_CENSUS_RATIO_DEFAULT.source,
  },
  'linkage-disequilibrium': {
    label: 'Linkage disequilibrium (genotypes)',
    formula: 'From r² between unlinked loci, with the small-sample correction',
    assumptions: 'Recorded from an external analysis. Biased low in a population that received immigrants recently.',
    citation: 'Waples RS (2006) Conservation Genetics 7:167–184',
  },
  'temporal': {
    label: 'Temporal (genotypes)',
    formula: 'From the variance of allele-frequency change between two samples',
    assumptions: 'Recorded from an external analysis. Assumes a closed population between the samples.',
    citation: 'Waples RS (1989) Genetics 121:379–391',
  },
  'heterozygote-excess': {
    label: 'Heterozygote excess (genotypes)',
    formula: 'From the excess of heterozygotes over Hardy–Weinberg expectations',
    assumptions: 'Recorded from an external analysis; imprecise unless Ne is very small.',
    citation: 'Recorded with the estimate',
  },
  'other': {
    label: 'Other method',
    formula: 'As recorded with the estimate',
    assumptions: 'Recorded from elsewhere; see the source.',
    citation: 'Recorded with the estimate',
  },
}

/** The label of a stored method, including free-text methods the list does not know. */
export function effectiveSizeMethodLabel(method: string): string {
  return (EFFECTIVE_SIZE_METHOD_INFO as Record<string, EffectiveSizeMethodInfo | undefined>)[method]?.label ?? method
}

/** The smallest working Ne accepted: the smallest effective size the drift formulas accept. */
export const MINIMUM_WORKING_NE = MINIMUM_EFFECTIVE_SIZE

/** PUT /api/subpopulations/:id/working-ne: the biologist's choice and why (value null clears it). */
export const WorkingNeSchema = z.object({
  value: z.number({ error: 'Enter the working Ne as a number.' })
    .min(MINIMUM_WORKING_NE, `The working Ne must be at least ${MINIMUM_WORKING_NE}.`)
    .max(MAX_INPUT, `The working Ne must be at most ${MAX_INPUT.toLocaleString('en-GB')}.`)
    .nullable(),
  /** The saved estimate the value comes from, if it does (its value must then match). */
  estimateId: z.number({ error: 'estimateId must be the number of a saved estimate.' }).int().positive().nullable().optional(),
  reason: z.string({ error: 'Write why this is the working Ne.' }).trim()
    .min(10, 'Write why this is the working Ne (at least 10 characters).')
    .max(2000, 'The reason has at most 2000 characters.'),
  version: VersionSchema,
})
export type WorkingNeInput = z.infer<typeof WorkingNeSchema>

/** Someone who did something, as the record shows them. */
export interface RecordActorDto { id: number, name: string }

/** One saved estimate with its provenance. */
export interface EffectiveSizeEstimateDto {
  id: number
  subpopulationId: number
  method: string
  methodLabel: string
  inputs: Record<string, unknown>
  value: number
  intervalLow: number | null
  intervalHigh: number | null
  /** YYYY-MM-DD */
  estimatedOn: string | null
  source: string
  createdBy: RecordActorDto | null
  createdAt: string
  /** True when this estimate is the source of the current working Ne. */
  isWorking: boolean
}

/** The working Ne of a subpopulation and who chose it, when and why. */
export interface WorkingNeDto {
  value: number | null
  reason: string | null
  estimateId: number | null
  setBy: RecordActorDto | null
  setAt: string | null
  /** The subpopulation's version (send back with PUT …/working-ne). */
  version: number
}

/** GET /api/subpopulations/:id/effective-sizes */
export interface EffectiveSizeListResponse {
  items: EffectiveSizeEstimateDto[]
  working: WorkingNeDto
}
