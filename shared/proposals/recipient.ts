/**
 * The recipient figures a scenario's results use: the record's census, working Ne, generation
 * time and starting inbreeding, with the scenario's what-if overrides applied field by field,
 * and where each figure came from (shown beside the inputs).
 *
 * Record → figures: census = latest census count of adults; Ne = the working Ne as the server
 * resolves it (working Ne, else the latest estimate, else 0.1 × latest census — Frankham
 * 1995); generation time from the record; F₀ = 0 (the record holds no pedigree F, so
 * inbreeding is measured from today unless the scenario overrides it).
 */
import type { RecipientFigures } from './types'

/** What the record offers (a subset of ProposalSubpopulationDto). */
export interface RecipientRecord {
  latestCensus: { year: number, adults: number } | null
  workingNe: number | null
  workingNeBasis?: 'working' | 'estimate' | 'census-ratio' | 'none'
  generationTimeYears: number
}

export type FigureSource = 'record' | 'override' | 'missing' | 'assumed'

export interface ResolvedRecipient {
  /** Null when a figure is missing or outside the engine's domain. */
  figures: RecipientFigures | null
  sources: Record<keyof RecipientFigures, FigureSource>
  /** Plain sentences naming what is missing or invalid. */
  problems: string[]
}

/**
 * Record figures with overrides applied, checked against the engine's domain.
 *
 * @param record - the recipient's record figures
 * @param overrides - the scenario's what-if overrides (each optional)
 * @returns the figures (or null) with their sources and any problems
 * @example resolveRecipient({ latestCensus: { year: 2024, adults: 66 }, workingNe: 12, generationTimeYears: 2.2 }, { effectiveSize: 20 }).figures
 *   // { census: 66, effectiveSize: 20, generationTimeYears: 2.2, initialInbreeding: 0 }
 */
export function resolveRecipient(record: RecipientRecord, overrides?: Partial<RecipientFigures> | null): ResolvedRecipient {
  const problems: string[] = []
  const pick = (override: number | undefined, recordValue: number | null | undefined): [number | null, FigureSource] => {
    if (override !== undefined && override !== null) return [override, 'override']
    if (recordValue !== undefined && recordValue !== null) return [recordValue, 'record']
    return [null, 'missing']
  }
  const [census, censusSource] = pick(overrides?.census, record.latestCensus?.adults)
  const [effectiveSize, neSource] = pick(overrides?.effectiveSize, record.workingNe)
  const [generationTimeYears, generationSource] = pick(overrides?.generationTimeYears, record.generationTimeYears)
  const inbreedingOverride = overrides?.initialInbreeding
  const initialInbreeding = inbreedingOverride ?? 0
  const inbreedingSource: FigureSource = inbreedingOverride === undefined ? 'assumed' : 'override'

  if (census === null) problems.push('The recipient has no census count: add one to its record or enter a census here.')
  else if (!Number.isInteger(census) || census < 1) problems.push(`The census must be a whole number of at least 1 animal (got ${census}).`)
  if (effectiveSize === null) problems.push('The recipient has no effective size: set a working Ne on its record or enter one here.')
  else if (!(effectiveSize >= 0.5)) problems.push(`The effective size must be at least 0.5 (got ${effectiveSize}).`)
  if (generationTimeYears === null || !(generationTimeYears > 0)) problems.push('The generation time must be more than 0 years.')
  if (!(initialInbreeding >= 0 && initialInbreeding < 1)) problems.push(`The starting inbreeding F must be at least 0 and below 1 (got ${initialInbreeding}).`)

  const sources = { census: censusSource, effectiveSize: neSource, generationTimeYears: generationSource, initialInbreeding: inbreedingSource }
  if (problems.length > 0 || census === null || effectiveSize === null || generationTimeYears === null) return { figures: null, sources, problems }
  return { figures: { census, effectiveSize, generationTimeYears, initialInbreeding }, sources, problems }
}

/**
 * The record figures with overrides applied, without checks (computeScenarioResults checks
 * through the engine).
 *
 * @param recipient - the record's figures
 * @param overrides - what-if values; absent fields keep the record's
 * @returns a new object
 * @example applyRecipientOverrides({ census: 66, effectiveSize: 12, generationTimeYears: 2.2, initialInbreeding: 0 }, { effectiveSize: 40 })
 *   // { census: 66, effectiveSize: 40, generationTimeYears: 2.2, initialInbreeding: 0 }
 */
export function applyRecipientOverrides(recipient: RecipientFigures, overrides?: Partial<RecipientFigures> | null): RecipientFigures {
  return {
    census: overrides?.census ?? recipient.census,
    effectiveSize: overrides?.effectiveSize ?? recipient.effectiveSize,
    generationTimeYears: overrides?.generationTimeYears ?? recipient.generationTimeYears,
    initialInbreeding: overrides?.initialInbreeding ?? recipient.initialInbreeding,
  }
}
