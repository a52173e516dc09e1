/**
 * Simulation runs (issue 4) as forms and routes accept and return them:
 *   - SimulationRunCreateSchema: POST /api/runs { proposalId?, scenarioId?, model, parameters, seed?, replicates };
 *   - SimulationRunListQuerySchema: GET /api/runs?proposalId=&scenarioId=;
 *   - the DTOs of GET /api/runs/:id and the list.
 *
 * Division of labour: the schema checks the *shape* of `parameters` (names and types, no unknown
 * keys, since the parameters are stored to reproduce the run) and the *workload* limits of the
 * job runner (replicates, size); the engine's own checks (`runEstablishmentReplicates` /
 * `runRescueReplicates` with 0 replicates, see shared/simulation/check-parameters.ts) decide the
 * domain — "census must be an integer ≥ 1, got 0" — and the route answers those with 422 at
 * `parameters.<name>`.
 *
 * Units: times in generations; census in animals; s and h per generation (fitnesses AA = 1 + s,
 * Aa = 1 + h·s, aa = 1); frequencies and rates in [0, 1].
 */
import { z } from 'zod'
import type { EstablishmentResult, RescueResult } from '../genetics/simulate'

/** The two simulation models (shared/genetics/simulate). */
export const SIMULATION_MODELS = ['establishment', 'rescue'] as const
export type SimulationModel = typeof SIMULATION_MODELS[number]

/** Life cycle of a run: queued → running → succeeded | failed | cancelled (running → queued on a retry). */
export const SIMULATION_RUN_STATUSES = ['queued', 'running', 'succeeded', 'failed', 'cancelled'] as const
export type SimulationRunStatus = typeof SIMULATION_RUN_STATUSES[number]

/** Statuses after which a run never changes again. */
export const FINISHED_RUN_STATUSES: readonly SimulationRunStatus[] = ['succeeded', 'failed', 'cancelled']

/** Largest seed: the engine reads the low 32 bits, so seeds are unsigned 32-bit integers. */
export const MAXIMUM_SEED = 4_294_967_295

/**
 * Workload limits of the job runner (not of the model): they keep one run within minutes to an
 * hour on a few cores and its records within memory.
 */
export const SIMULATION_LIMITS = {
  establishment: {
    replicates: 100_000,
    /** replicates × generations (the work of the slowest case, no replicate finishing early). */
    replicateGenerations: 1_000_000_000,
  },
  rescue: {
    replicates: 1_000,
    /** replicates × (generations + 1): per-generation records kept for every replicate. */
    replicateGenerations: 200_000,
    /** Largest census of either population in any generation (the kinship matrix is N × N). */
    census: 2_000,
  },
  /** Longest per-generation schedule list accepted. */
  scheduleLength: 10_001,
} as const

/** Replicates a new run starts with in the panel. */
export const DEFAULT_REPLICATES: Readonly<Record<SimulationModel, number>> = { establishment: 2_000, rescue: 50 }

const number = (label: string) => z.number({ error: `${label} must be a number.` })
const schedule = (label: string) => z.union([
  number(label),
  z.array(number(`Each entry of ${label}`), { error: `${label} must be a number or a list of numbers (one per generation).` })
    .min(1, `${label} must list at least one value.`)
    .max(SIMULATION_LIMITS.scheduleLength, `${label} may list at most ${SIMULATION_LIMITS.scheduleLength} generations.`),
], { error: `${label} must be a number or a list of numbers (one per generation).` })

/** Inputs of `simulateEstablishment` (see shared/genetics/simulate/establishment/types.ts). */
export const EstablishmentParametersSchema = z.strictObject({
  census: schedule('census'),
  effectiveSize: schedule('effectiveSize'),
  s: number('s'),
  h: number('h'),
  sourceFrequency: number('sourceFrequency').optional(),
  introducedCopies: number('introducedCopies').optional(),
  migrantsPerEvent: number('migrantsPerEvent'),
  eventInterval: number('eventInterval'),
  events: number('events'),
  migrationRate: number('migrationRate').optional(),
  generations: number('generations'),
  firstEventGeneration: number('firstEventGeneration').optional(),
})
export type EstablishmentParameters = z.output<typeof EstablishmentParametersSchema>

const PopulationSchema = z.strictObject({
  census: schedule('census'),
  effectiveRatio: number('effectiveRatio').optional(),
  burnInCensus: schedule('burnInCensus').optional(),
  burnInGenerations: number('burnInGenerations').optional(),
})

/** Inputs of `simulateRescue` (see shared/genetics/simulate/rescue/types.ts). */
export const RescueParametersSchema = z.strictObject({
  recipient: PopulationSchema,
  source: PopulationSchema,
  generations: number('generations'),
  markerLoci: number('markerLoci').optional(),
  load: z.strictObject({
    loci: number('loci').optional(),
    mutationRate: number('mutationRate').optional(),
    meanSelection: number('meanSelection').optional(),
    selectionShape: number('selectionShape').optional(),
    meanDominance: number('meanDominance').optional(),
  }).nullable().optional(),
  adaptive: z.strictObject({
    s: number('s'),
    h: number('h'),
    sourceFrequency: number('sourceFrequency'),
    recipientFrequency: number('recipientFrequency').optional(),
  }).nullable().optional(),
  translocation: z.strictObject({
    migrantsPerEvent: number('migrantsPerEvent'),
    eventInterval: number('eventInterval'),
    events: number('events'),
    firstEventGeneration: number('firstEventGeneration').optional(),
    migrationRate: number('migrationRate').optional(),
  }),
  map: z.strictObject({
    chromosomes: number('chromosomes'),
    chromosomeLength: number('chromosomeLength'),
  }).optional(),
})
export type RescueParameters = z.output<typeof RescueParametersSchema>

const RecordIdSchema = z.number({ error: 'Must be a record number, like 42.' })
  .int('Must be a record number, like 42.')
  .min(1, 'Must be a record number, like 42.')
  .max(2_147_483_647, 'Must be a record number, like 42.')

const ReplicatesSchema = z.number({ error: 'replicates must be a whole number.' })
  .int('replicates must be a whole number.')
  .min(1, 'Run at least 1 replicate.')

const SeedSchema = z.number({ error: 'seed must be a whole number.' })
  .int('seed must be a whole number.')
  .min(0, 'seed must be at least 0.')
  .max(MAXIMUM_SEED, `seed must be at most ${MAXIMUM_SEED} (an unsigned 32-bit integer).`)

const common = {
  proposalId: RecordIdSchema.optional(),
  scenarioId: RecordIdSchema.optional(),
  seed: SeedSchema.optional(),
  replicates: ReplicatesSchema,
}

/** The largest value of a constant-or-per-generation input (NaN when not a number). */
function scheduleMaximum(value: number | readonly number[] | undefined): number {
  if (value === undefined) return Number.NaN
  return typeof value === 'number' ? value : Math.max(...value)
}

/** POST /api/runs */
export const SimulationRunCreateSchema = z.discriminatedUnion('model', [
  z.strictObject({ ...common, model: z.literal('establishment'), parameters: EstablishmentParametersSchema }),
  z.strictObject({ ...common, model: z.literal('rescue'), parameters: RescueParametersSchema }),
], { error: `model must be one of: ${SIMULATION_MODELS.join(', ')}.` }).superRefine((value, context) => {
  const limits = SIMULATION_LIMITS[value.model]
  if (value.replicates > limits.replicates) {
    context.addIssue({ code: 'custom', path: ['replicates'], message: `The ${value.model} model runs at most ${limits.replicates.toLocaleString('en-US')} replicates.` })
    return
  }
  const generations = value.parameters.generations
  if (!Number.isFinite(generations)) return // the engine names it
  const work = value.model === 'rescue' ? value.replicates * (generations + 1) : value.replicates * generations
  if (work > limits.replicateGenerations) {
    const what = value.model === 'rescue' ? 'replicates × (generations + 1)' : 'replicates × generations'
    context.addIssue({
      code: 'custom', path: ['replicates'],
      message: `${what} must be at most ${limits.replicateGenerations.toLocaleString('en-US')} for the ${value.model} model (got ${work.toLocaleString('en-US')}); run fewer replicates or fewer generations.`,
    })
  }
  if (value.model === 'rescue') {
    const cap = SIMULATION_LIMITS.rescue.census
    for (const population of ['recipient', 'source'] as const) {
      for (const field of ['census', 'burnInCensus'] as const) {
        if (scheduleMaximum(value.parameters[population][field]) > cap) {
          context.addIssue({ code: 'custom', path: ['parameters', population, field], message: `The individual-based model handles at most ${cap.toLocaleString('en-US')} animals per population.` })
        }
      }
    }
  }
})
export type SimulationRunCreateInput = z.input<typeof SimulationRunCreateSchema>
export type SimulationRunCreate = z.output<typeof SimulationRunCreateSchema>

const QueryIdSchema = z.string()
  .regex(/^\d{1,10}$/, 'Must be a record number, like 42.')
  .transform(Number)
  .pipe(RecordIdSchema)

/** GET /api/runs?proposalId=&scenarioId=&limit= (newest first; limit 1–100, default 20). */
export const SimulationRunListQuerySchema = z.object({
  proposalId: QueryIdSchema.optional(),
  scenarioId: QueryIdSchema.optional(),
  limit: z.coerce.number({ error: 'limit must be a whole number.' }).int('limit must be a whole number.')
    .min(1, 'limit must be at least 1.').max(100, 'limit must be at most 100.').default(20),
})

/** A person named on a run. */
export interface SimulationRunPersonDto { id: number, name: string }

/** One run as GET /api/runs (without `result`) and GET /api/runs/:id return it. Dates are ISO 8601. */
export interface SimulationRunSummaryDto {
  id: number
  proposalId: number | null
  scenarioId: number | null
  model: SimulationModel
  /** Exactly what the engine was given (send back to reproduce the run). */
  parameters: EstablishmentParameters | RescueParameters
  seed: number
  replicates: number
  /** Version of the simulation engine that produced (or will produce) the result. */
  engineVersion: string
  status: SimulationRunStatus
  /** Share of replicates done, 0–1. */
  progress: number
  /** Why the run failed (status 'failed'), else null. */
  error: string | null
  /** Times a worker has started this run (more than 1 after a retry). */
  attempts: number
  requestedBy: SimulationRunPersonDto | null
  createdAt: string
  startedAt: string | null
  finishedAt: string | null
  version: number
}

/** The stored result: `simulateEstablishment` or `simulateRescue` output, as JSON. */
export type SimulationResult = EstablishmentResult | RescueResult

/** GET /api/runs/:id (and POST, DELETE answers). */
export interface SimulationRunDto extends SimulationRunSummaryDto {
  /** Present once the run succeeded. */
  result: SimulationResult | null
}

/** GET /api/runs */
export interface SimulationRunListResponse { items: SimulationRunSummaryDto[] }
