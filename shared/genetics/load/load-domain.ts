import { domainError, requireInRange } from '../validate'

/**
 * Checks shared by the inbreeding-depression functions (internal, not
 * re-exported): diploid lethal equivalents are a finite number ≥ 0 (negative
 * published estimates are sampling noise, not a planning input), and an
 * inbreeding coefficient lies in [0, 1].
 */
export function requireLethalEquivalents(fn: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    domainError(fn, 'diploidLethalEquivalents', 'a finite number ≥ 0', value)
  }
}

export function requireInbreeding(fn: string, parameter: string, value: number): void {
  requireInRange(fn, parameter, value, 0, 1)
}

/** B, lethal equivalents per gamete, from the diploid figure 2B. */
export function lethalEquivalentsPerGamete(diploidLethalEquivalents: number): number {
  return diploidLethalEquivalents / 2
}
