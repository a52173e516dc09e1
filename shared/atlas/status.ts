/**
 * Our status scale for the Atlas: how fast a subpopulation is expected to lose genetic
 * diversity, read from one number — the inbreeding coefficient F projected 10 generations
 * ahead at the subpopulation's working effective size — plus a band of that effective size.
 *
 * The thresholds below are a PRODUCT CHOICE of Tributary, not a published standard. They are
 * placed so that the boundaries fall near the effective sizes of the rules of thumb in common
 * practice: the "50/500" rule (Ne ≥ 50 against short-term inbreeding depression, Ne ≥ 500 for
 * long-term evolutionary potential; Franklin 1980) and its revision to "100/1000" (Frankham,
 * Bradshaw & Brook 2014, Biological Conservation 170: 56–63); SCIENCE.md §6.4. With
 * F₁₀ = 1 − (1 − 1/(2Ne))¹⁰ (Wright 1931; SCIENCE.md eq. 4.1, F₀ = 0):
 *
 *   F₁₀ ≥ 0.10          losing diversity fast   Ne below ≈ 47.7
 *   0.05 ≤ F₁₀ < 0.10   declining               Ne ≈ 47.7 – 97.7
 *   0.01 ≤ F₁₀ < 0.05   watch                   Ne ≈ 97.7 – 497.8
 *   0.005 ≤ F₁₀ < 0.01  stable                  Ne ≈ 497.8 – 997.7
 *   F₁₀ < 0.005         well connected          Ne above ≈ 997.7
 *
 * "Well connected" means inbreeding rises as slowly as it does in a large population or one
 * that exchanges migrants; the scale does not know about actual gene flow.
 *
 * Read by: the Atlas map, list, legend and side panel (components/atlas/**, components/map/**),
 * the subpopulation DTOs (server/atlas/subpopulation-dto.ts) and the tests in
 * tests/unit/atlas/status.test.ts. Changing a threshold changes every colour on the map.
 */
import { inbreedingAfter } from '../genetics'

/** Generations ahead at which the status projects F. */
export const STATUS_HORIZON_GENERATIONS = 10

/** Keys of the status levels; they match the tailwind colour tokens `status.*`. */
export type StatusLevelKey = 'critical' | 'declining' | 'watch' | 'stable' | 'connected'

/** A level, or 'unknown' when there is no effective size to project from. */
export type StatusKey = StatusLevelKey | 'unknown'

/** One step of the status scale. */
export interface StatusLevel {
  key: StatusLevelKey
  /** Words shown in the legend and the list (never colour alone). */
  label: string
  /** One sentence for the legend. */
  description: string
  /** Lowest projected F₁₀ that falls in this level (inclusive). */
  minimumProjectedInbreeding: number
}

/** The scale from worst to best (product choice; see the file comment). */
export const STATUS_LEVELS: readonly StatusLevel[] = [
  {
    key: 'critical',
    label: 'Losing diversity fast',
    description: 'F rises by 0.10 or more within 10 generations (Ne below about 48).',
    minimumProjectedInbreeding: 0.10,
  },
  {
    key: 'declining',
    label: 'Declining',
    description: 'F rises by 0.05 to 0.10 within 10 generations (Ne about 48 to 98).',
    minimumProjectedInbreeding: 0.05,
  },
  {
    key: 'watch',
    label: 'Watch',
    description: 'F rises by 0.01 to 0.05 within 10 generations (Ne about 98 to 498).',
    minimumProjectedInbreeding: 0.01,
  },
  {
    key: 'stable',
    label: 'Stable',
    description: 'F rises by 0.005 to 0.01 within 10 generations (Ne about 498 to 998).',
    minimumProjectedInbreeding: 0.005,
  },
  {
    key: 'connected',
    label: 'Well connected',
    description: 'F rises by less than 0.005 within 10 generations, as in a large or connected population (Ne above about 998).',
    minimumProjectedInbreeding: 0,
  },
]

/** Shown for subpopulations without an effective size, census or estimate. */
export const UNKNOWN_STATUS = {
  key: 'unknown' as const,
  label: 'No figures yet',
  description: 'No working Ne, Ne estimate or census count: the status cannot be projected.',
}

/** Keys of the Ne bands (marker size on the map). */
export type NeBandKey = 'under-50' | '50-99' | '100-499' | '500-999' | '1000-plus'

/** A band of working effective size; drawn as a marker size. */
export interface NeBand {
  key: NeBandKey
  label: string
  /** Lowest Ne in the band (inclusive). */
  minimum: number
  /** Marker radius on the map, in CSS pixels. */
  radius: number
}

/** Ne bands at the 50/100/500/1000 figures of common practice (SCIENCE.md §6.4). */
export const NE_BANDS: readonly NeBand[] = [
  { key: 'under-50', label: 'Ne under 50', minimum: 0, radius: 5 },
  { key: '50-99', label: 'Ne 50–99', minimum: 50, radius: 7 },
  { key: '100-499', label: 'Ne 100–499', minimum: 100, radius: 9 },
  { key: '500-999', label: 'Ne 500–999', minimum: 500, radius: 11 },
  { key: '1000-plus', label: 'Ne 1000 or more', minimum: 1000, radius: 13 },
]

/**
 * Status level of a projected inbreeding coefficient.
 *
 * @param projectedInbreeding - F after STATUS_HORIZON_GENERATIONS generations, in [0, 1]
 * @returns the level whose range holds it (thresholds: 0.10, 0.05, 0.01, 0.005)
 * @example statusLevelFor(0.0956).key // 'declining' (Ne = 50)
 * @example statusLevelFor(0.10).key   // 'critical' (boundaries belong to the worse level)
 * @example statusLevelFor(0).key      // 'connected'
 */
export function statusLevelFor(projectedInbreeding: number): StatusLevel {
  for (const level of STATUS_LEVELS) {
    if (projectedInbreeding >= level.minimumProjectedInbreeding) return level
  }
  // Only NaN reaches here; the last level has minimum 0.
  return STATUS_LEVELS[STATUS_LEVELS.length - 1] as StatusLevel
}

/**
 * The Ne band of an effective size.
 *
 * @param effectiveSize - Ne, individuals, ≥ 0
 * @returns the band (bands start at 0, 50, 100, 500, 1000)
 * @example neBandFor(49.9).key // 'under-50'
 * @example neBandFor(50).key   // '50-99'
 * @example neBandFor(4000).key // '1000-plus'
 */
export function neBandFor(effectiveSize: number): NeBand {
  let found = NE_BANDS[0] as NeBand
  for (const band of NE_BANDS) if (effectiveSize >= band.minimum) found = band
  return found
}

/**
 * Projected inbreeding coefficient after `generations` generations of drift at a constant
 * effective size, starting from F₀ = 0 (relative to today): F_t = 1 − (1 − 1/(2Ne))ᵗ
 * (Wright 1931; SCIENCE.md eq. 4.1) through the engine's `inbreedingAfter`.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param generations - t, ≥ 0 (default 10)
 * @returns F_t in [0, 1]
 * @throws RangeError from the engine for Ne < ½
 * @example projectedInbreeding(50) // 0.09561792499119552
 */
export function projectedInbreeding(effectiveSize: number, generations = STATUS_HORIZON_GENERATIONS): number {
  return inbreedingAfter({ effectiveSize, generations })
}
