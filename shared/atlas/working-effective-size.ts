/**
 * Which effective size the Atlas projects from, and how the subpopulation's status follows.
 *
 * Order of preference (a product rule, stated on screen):
 *   1. the working Ne the team chose for the record (with their reason);
 *   2. else the latest Ne estimate (by date, then entry);
 *   3. else 0.1 × the latest census of adults — the typical wildlife Ne/N of about 0.10–0.11
 *      (Frankham 1995, Genetical Research 66: 95–107; SCIENCE.md §5), shown with a note;
 *   4. else nothing: status 'unknown'.
 */
import {
  NE_BANDS, STATUS_HORIZON_GENERATIONS, UNKNOWN_STATUS, neBandFor, projectedInbreeding, statusLevelFor,
  type NeBandKey, type StatusKey,
} from './status'

/** Ne/N assumed when only a census is known (SCIENCE.md §5, engine default). */
export const DEFAULT_NE_TO_CENSUS_RATIO = 0.1

/** Where the working effective size comes from. */
export type EffectiveSizeBasis = 'working' | 'estimate' | 'census-ratio' | 'none'

/** The effective size the Atlas uses, with its provenance in words. */
export interface WorkingEffectiveSize {
  /** Ne, individuals; null when nothing is known. */
  value: number | null
  basis: EffectiveSizeBasis
  /** Estimator slug for basis 'estimate' (e.g. 'harmonic-mean'); null otherwise. */
  method: string | null
  /** One sentence: where the figure comes from. */
  note: string
}

/** What the status needs to know about a subpopulation. */
export interface EffectiveSizeInputs {
  workingNe: number | null
  workingNeReason: string | null
  latestEstimate: { method: string, value: number, estimatedOn: string | null } | null
  latestCensus: { year: number, adults: number } | null
}

/** The status of a subpopulation as the Atlas shows it. */
export interface SubpopulationStatus {
  key: StatusKey
  label: string
  /** F after `generations` generations at the working Ne; null when it cannot be projected. */
  projectedInbreeding: number | null
  generations: number
  neBand: NeBandKey | null
  /** Why the figure is missing or uncertain, when it is; '' otherwise. */
  caveat: string
}

/** Words for the estimator slugs of shared/types/db.ts EFFECTIVE_SIZE_METHODS. */
const METHOD_WORDS: Record<string, string> = {
  'sex-ratio': 'sex ratio',
  'harmonic-mean': 'harmonic mean over the census series',
  'family-size-variance': 'family-size variance',
  'ne-n-ratio': 'Ne/N ratio',
  'linkage-disequilibrium': 'linkage disequilibrium',
  'temporal': 'temporal method',
  'heterozygote-excess': 'heterozygote excess',
  'other': 'other method',
}

/**
 * Readable name of an effective-size method slug.
 *
 * @example methodWords('harmonic-mean') // 'harmonic mean over the census series'
 * @example methodWords('my-own')        // 'my own'
 */
export function methodWords(method: string): string {
  return METHOD_WORDS[method] ?? method.replace(/[-_]+/g, ' ')
}

/**
 * The effective size to project from (see the order at the top of this file).
 *
 * @param inputs - working Ne and reason, latest estimate, latest census
 * @returns value (individuals), basis, method and a note in words
 * @example workingEffectiveSize({ workingNe: null, workingNeReason: null, latestEstimate: null, latestCensus: { year: 2024, adults: 134 } })
 *   // { value: 13.4, basis: 'census-ratio', method: null, note: 'No Ne estimate yet: assumed 0.1 × the 2024 census of 134 adults, a typical wildlife Ne/N.' }
 */
export function workingEffectiveSize(inputs: EffectiveSizeInputs): WorkingEffectiveSize {
  if (inputs.workingNe !== null && Number.isFinite(inputs.workingNe)) {
    const reason = inputs.workingNeReason?.trim()
    return { value: inputs.workingNe, basis: 'working', method: null, note: reason ? `Chosen by the team: ${reason}` : 'Chosen by the team.' }
  }
  if (inputs.latestEstimate) {
    const { method, value, estimatedOn } = inputs.latestEstimate
    const when = estimatedOn ? ` of ${estimatedOn}` : ''
    return { value, basis: 'estimate', method, note: `Latest estimate${when} (${methodWords(method)}); no working Ne chosen yet.` }
  }
  if (inputs.latestCensus) {
    const { year, adults } = inputs.latestCensus
    const value = Math.round(adults * DEFAULT_NE_TO_CENSUS_RATIO * 1e6) / 1e6
    return {
      value,
      basis: 'census-ratio',
      method: null,
      note: `No Ne estimate yet: assumed ${DEFAULT_NE_TO_CENSUS_RATIO} × the ${year} census of ${adults} adults, a typical wildlife Ne/N.`,
    }
  }
  return { value: null, basis: 'none', method: null, note: 'No working Ne, Ne estimate or census yet.' }
}

/** Smallest Ne the drift formula accepts (engine: Ne ≥ ½). */
const SMALLEST_PROJECTABLE_NE = 0.5

/**
 * Status of a subpopulation: projected F after 10 generations at its working effective size,
 * the level of our scale it falls in, and its Ne band.
 *
 * Edge cases: no effective size → 'unknown'; Ne = 0 (a census of no adults) → 'unknown' with a
 * caveat; 0 < Ne < ½ (below what the drift formula accepts) → 'critical' without a projected F.
 *
 * @param effectiveSize - the working effective size (see workingEffectiveSize)
 * @returns key, label, projected F, horizon, Ne band and caveat
 * @example subpopulationStatus({ value: 50, basis: 'estimate', method: 'sex-ratio', note: '' }).key // 'declining'
 */
export function subpopulationStatus(effectiveSize: Pick<WorkingEffectiveSize, 'value' | 'basis'>): SubpopulationStatus {
  const generations = STATUS_HORIZON_GENERATIONS
  const value = effectiveSize.value
  if (value === null || !Number.isFinite(value) || value < 0) {
    return { key: UNKNOWN_STATUS.key, label: UNKNOWN_STATUS.label, projectedInbreeding: null, generations, neBand: null, caveat: UNKNOWN_STATUS.description }
  }
  if (value === 0) {
    return { key: UNKNOWN_STATUS.key, label: UNKNOWN_STATUS.label, projectedInbreeding: null, generations, neBand: null, caveat: 'The latest census counted no adults.' }
  }
  const band = neBandFor(value).key
  if (value < SMALLEST_PROJECTABLE_NE) {
    const critical = statusLevelFor(1)
    return { key: critical.key, label: critical.label, projectedInbreeding: null, generations, neBand: band, caveat: 'Ne is below ½: too small for the drift projection.' }
  }
  const projected = projectedInbreeding(value, generations)
  const level = statusLevelFor(projected)
  const caveat = effectiveSize.basis === 'census-ratio' ? 'Ne assumed from the census (0.1 × adults).' : ''
  return { key: level.key, label: level.label, projectedInbreeding: projected, generations, neBand: band, caveat }
}

/** Band keys in order, for legends and filters. */
export const NE_BAND_KEYS: readonly NeBandKey[] = NE_BANDS.map(band => band.key)
