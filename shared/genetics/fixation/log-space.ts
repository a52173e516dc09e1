/**
 * log(eˣ + eʸ) without overflow or underflow (internal helper).
 * Either argument may be −Infinity (an empty or zero term).
 *
 * @example logAddExp(0, 0)           // 0.6931471805599453
 * @example logAddExp(-1e6, -Infinity) // -1000000
 */
export function logAddExp(x: number, y: number): number {
  if (x === -Infinity) return y
  if (y === -Infinity) return x
  return x >= y ? x + Math.log1p(Math.exp(y - x)) : y + Math.log1p(Math.exp(x - y))
}
