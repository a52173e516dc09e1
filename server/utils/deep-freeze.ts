/**
 * Freezes an object and everything it holds (plain JSON-like data), so an answer remembered for
 * several requests cannot be changed in place by one of them. Returns its argument.
 */
export function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value)
    for (const child of Object.values(value as Record<string, unknown>)) deepFreeze(child)
  }
  return value
}
