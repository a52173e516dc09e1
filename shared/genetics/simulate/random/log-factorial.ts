import { domainError } from '../../validate'

const TABLE_SIZE = 256
const LOG_FACTORIAL_TABLE = buildTable()

function buildTable(): Float64Array {
  const table = new Float64Array(TABLE_SIZE)
  for (let k = 1; k < TABLE_SIZE; k++) table[k] = (table[k - 1] ?? 0) + Math.log(k)
  return table
}

const HALF_LOG_TWO_PI = 0.9189385332046728

/**
 * Natural logarithm of k! for a non-negative integer k.
 *
 * Method: a table of running sums of ln i for k < 256 (relative error a few
 * ulp); above, Stirling's series ln k! = (k + ½)ln k − k + ½ln(2π) + 1/(12k)
 * − 1/(360k³) + 1/(1260k⁵), whose truncation error is below 1/(1680k⁷)
 * < 10⁻¹⁹ at k ≥ 256 (Abramowitz & Stegun 1964, 6.1.41).
 *
 * @param k - integer ≥ 0
 * @returns ln k!, ≥ 0
 * @throws RangeError if k is not a non-negative integer
 * @example logFactorial(0)   // 0
 * @example logFactorial(5)   // 4.787491742782046 (= ln 120)
 * @example logFactorial(1000) // 5912.128178488163
 */
export function logFactorial(k: number): number {
  if (!(k >= 0) || !Number.isInteger(k)) domainError('logFactorial', 'k', 'an integer ≥ 0', k)
  if (k < TABLE_SIZE) return LOG_FACTORIAL_TABLE[k] ?? 0
  const inverse = 1 / k
  const inverseSquare = inverse * inverse
  return (k + 0.5) * Math.log(k) - k + HALF_LOG_TWO_PI
    + inverse * (1 / 12 - inverseSquare * (1 / 360 - inverseSquare / 1260))
}
