/**
 * Domain checks shared by every engine function.
 *
 * Policy (STYLE.md item 26): inputs are zod-validated before they reach the
 * engine, so the engine throws `RangeError` with one message format:
 * `<function>: <parameter> must be <constraint>, got <value>`.
 */

/** Throws the engine's standard RangeError. */
export function domainError(fn: string, parameter: string, constraint: string, value: unknown): never {
  throw new RangeError(`${fn}: ${parameter} must be ${constraint}, got ${String(value)}`)
}

/** Requires a finite number. */
export function requireFinite(fn: string, parameter: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) domainError(fn, parameter, 'a finite number', value)
}

/** Requires a finite number strictly greater than zero. */
export function requirePositive(fn: string, parameter: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) domainError(fn, parameter, 'a finite number > 0', value)
}

/** Requires a finite number greater than or equal to zero. */
export function requireNonNegative(fn: string, parameter: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) domainError(fn, parameter, 'a finite number ≥ 0', value)
}

/** Requires an integer ≥ `min`. */
export function requireInteger(fn: string, parameter: string, value: number, min = 0): void {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < min) domainError(fn, parameter, `an integer ≥ ${min}`, value)
}

/** Requires a number in the closed interval [low, high]. */
export function requireInRange(fn: string, parameter: string, value: number, low: number, high: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < low || value > high) domainError(fn, parameter, `in [${low}, ${high}]`, value)
}
