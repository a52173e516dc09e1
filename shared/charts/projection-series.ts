/**
 * The numbers behind the record page's projections: expected inbreeding F, heterozygosity H and
 * relative fitness over a horizon in years, at the working Ne, isolated and with a constant
 * rate of gene flow. Every figure comes from the engine:
 *
 * - years → generations: `generationsFromYears` (generation time from the record);
 * - F_t: `inbreedingTrajectory` (Wright 1931; island model eq. 4.2 with migration), F measured
 *   from today (today's F taken as 0);
 * - H_t / H_today = 1 − F_t (Wright 1931; equal to `heterozygosityRetained` when isolated);
 * - fitness: `relativeFitness` (Morton, Crow & Muller 1956) with the chosen diploid lethal
 *   equivalents, relative to a non-inbred animal of today.
 *
 * The island model runs in whole generations, so the series has one point per whole
 * generation up to the horizon (the last point can fall short of it by less than a generation).
 * Pure; the page and the PDF brief call the same function.
 */
import {
  equilibriumInbreeding,
  generationsFromYears,
  inbreedingTrajectory,
  migrantsPerGeneration,
  relativeFitness,
  yearsFromGenerations,
} from '../genetics'

/** One point of a projection. */
export interface ProjectionPoint {
  /** Whole generations from now. */
  generation: number
  /** The same time in years (generation × generation time). */
  years: number
  /** Expected inbreeding F, from today. */
  inbreeding: number
  /** Heterozygosity as a share of today's, 1 − F. */
  heterozygosity: number
  /** Expected fitness relative to a non-inbred animal, exp(−B·F). */
  fitness: number
}

export interface ProjectionInput {
  /** Working Ne, individuals per generation, ≥ ½. */
  effectiveSize: number
  /** Generation time from the record, years per generation, > 0. */
  generationTimeYears: number
  /** Horizon in years, ≥ 0 (the page uses 50). */
  horizonYears: number
  /** m, fraction of breeding genes from immigrants per generation, in [0, 1]; 0 = no gene-flow series. */
  migrationRate: number
  /** 2B, diploid lethal equivalents, ≥ 0. */
  diploidLethalEquivalents: number
}

export interface Projection {
  /** The horizon in generations, as `generationsFromYears` gives it (real). */
  horizonGenerations: number
  /** Whole generations shown (⌊horizonGenerations⌋). */
  wholeGenerations: number
  /** The years those whole generations span. */
  wholeGenerationYears: number
  isolated: ProjectionPoint[]
  /** Null when the migration rate is 0. */
  withGeneFlow: ProjectionPoint[] | null
  /** Effective migrants per generation, Ne·m. */
  migrantsPerGeneration: number
  /** F the gene-flow series tends to (island-model equilibrium); null without gene flow. */
  equilibriumInbreeding: number | null
}

function pointsFor(input: ProjectionInput, generations: number, migrationRate: number): ProjectionPoint[] {
  const trajectory = inbreedingTrajectory({ effectiveSize: input.effectiveSize, generations, migrationRate })
  return trajectory.map((inbreeding, generation) => ({
    generation,
    years: yearsFromGenerations({ generations: generation, generationTime: input.generationTimeYears }),
    inbreeding,
    heterozygosity: 1 - inbreeding,
    fitness: relativeFitness({ diploidLethalEquivalents: input.diploidLethalEquivalents, inbreeding }),
  }))
}

/**
 * Projects F, H and relative fitness at the working Ne over the horizon.
 *
 * @param input - see ProjectionInput (units there)
 * @returns the isolated series, the gene-flow series (when m > 0) and the conversions used
 * @throws RangeError from the engine when an input is outside its domain
 * @example projectSubpopulation({ effectiveSize: 50, generationTimeYears: 5, horizonYears: 50, migrationRate: 0.02, diploidLethalEquivalents: 12 })
 *   // horizonGenerations 10; isolated[10].inbreeding ≈ 0.0956; withGeneFlow[10].inbreeding ≈ 0.0773
 */
export function projectSubpopulation(input: ProjectionInput): Projection {
  const horizonGenerations = generationsFromYears({ years: input.horizonYears, generationTime: input.generationTimeYears })
  // A float quotient like 50 / 2.5 can land a hair under a whole number; keep 20, not 19.
  const wholeGenerations = Math.floor(horizonGenerations + 1e-9)
  const withFlow = input.migrationRate > 0
  return {
    horizonGenerations,
    wholeGenerations,
    wholeGenerationYears: yearsFromGenerations({ generations: wholeGenerations, generationTime: input.generationTimeYears }),
    isolated: pointsFor(input, wholeGenerations, 0),
    withGeneFlow: withFlow ? pointsFor(input, wholeGenerations, input.migrationRate) : null,
    migrantsPerGeneration: migrantsPerGeneration({ effectiveSize: input.effectiveSize, migrationRate: input.migrationRate }),
    equilibriumInbreeding: withFlow ? equilibriumInbreeding({ effectiveSize: input.effectiveSize, migrationRate: input.migrationRate }) : null,
  }
}

/** How gene flow is entered: effective migrants per generation (Ne·m) or the rate m itself. */
export type GeneFlowEntry = { kind: 'migrants', value: number } | { kind: 'rate', value: number }

/**
 * The migration rate m for an entry: m itself, or migrants / Ne (Ne·m = migrants).
 *
 * @param entry - migrants per generation (≥ 0) or m (in [0, 1])
 * @param effectiveSize - working Ne, > 0
 * @returns m, or an explanation when the entry cannot be used
 * @example migrationRateFromEntry({ kind: 'migrants', value: 1 }, 50)  // { ok: true, rate: 0.02 }
 * @example migrationRateFromEntry({ kind: 'migrants', value: 80 }, 50) // { ok: false, message: … }
 */
export function migrationRateFromEntry(entry: GeneFlowEntry, effectiveSize: number): { ok: true, rate: number } | { ok: false, message: string } {
  if (!Number.isFinite(entry.value) || entry.value < 0) return { ok: false, message: 'Enter a number, 0 or more.' }
  if (entry.kind === 'rate') {
    return entry.value <= 1 ? { ok: true, rate: entry.value } : { ok: false, message: 'm is a fraction of genes per generation: between 0 and 1.' }
  }
  if (!(effectiveSize > 0)) return { ok: false, message: 'Set a working Ne first.' }
  const rate = entry.value / effectiveSize
  return rate <= 1
    ? { ok: true, rate }
    : { ok: false, message: `More effective migrants (${entry.value}) than the working Ne (${effectiveSize}) would replace the whole breeding population each generation.` }
}

/**
 * The last point at or before `years` (the summary rows of the page: 10, 25, 50 years).
 *
 * @returns the point, or undefined when the series is empty
 */
export function projectionPointAt(points: readonly ProjectionPoint[], years: number): ProjectionPoint | undefined {
  let found: ProjectionPoint | undefined
  for (const point of points) {
    if (point.years <= years + 1e-9) found = point
  }
  return found
}
