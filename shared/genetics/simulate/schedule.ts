import { domainError } from '../validate'

/** A quantity that is either constant or given generation by generation. */
export type Schedule = number | readonly number[]

/**
 * Expands a constant-or-per-generation input into one value per generation.
 *
 * Convention: entry t applies to generation t (t = 0 is the first simulated
 * generation); a schedule shorter than the horizon keeps its last value, so
 * `[100, 20]` means "100 now, 20 from the next generation on".
 *
 * @param fn - calling function's name, for error messages
 * @param parameter - the input's name, for error messages
 * @param schedule - a number or a non-empty array of numbers
 * @param length - number of generations to produce, integer ≥ 1
 * @param accept - domain test for each value
 * @param constraint - text describing `accept`, for error messages
 * @returns a new Float64Array of `length` values
 * @throws RangeError if the schedule is empty or a value fails `accept`
 * @example expandSchedule('f', 'census', [100, 20], 4, v => v >= 1, '≥ 1') // Float64Array [100, 20, 20, 20]
 * @example expandSchedule('f', 'census', 50, 2, v => v >= 1, '≥ 1') // Float64Array [50, 50]
 */
export function expandSchedule(
  fn: string,
  parameter: string,
  schedule: Schedule,
  length: number,
  accept: (value: number) => boolean,
  constraint: string,
): Float64Array {
  const values = new Float64Array(length)
  if (typeof schedule === 'number') {
    if (!accept(schedule)) domainError(fn, parameter, constraint, schedule)
    values.fill(schedule)
    return values
  }
  if (!Array.isArray(schedule) || schedule.length === 0) domainError(fn, parameter, 'a number or a non-empty array of numbers', schedule)
  for (const value of schedule) {
    if (typeof value !== 'number' || !accept(value)) domainError(fn, `${parameter}[]`, constraint, value)
  }
  let last = schedule[0] as number // non-empty, checked above
  for (let generation = 0; generation < length; generation++) {
    last = schedule[generation] ?? last
    values[generation] = last
  }
  return values
}
