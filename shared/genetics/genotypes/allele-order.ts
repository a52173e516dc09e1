/**
 * Deterministic display and summation order for allele labels: labels that
 * are plain non-negative numbers (microsatellite sizes "101", "99.5") sort
 * numerically and come first; other labels ("A", "G", "big") follow in
 * code-unit order. Ties in numeric value ("7" vs "07") fall back to code
 * units, so the order is total and never depends on the user's locale.
 *
 * Summing over alleles in this fixed order makes results reproducible and
 * makes pairwise estimates exactly symmetric in their two populations.
 */
const NUMERIC_LABEL = /^\d+(\.\d+)?$/

function byCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0
}

/** Comparator for `Array.prototype.sort` over allele labels. */
export function compareAlleles(a: string, b: string): number {
  const aNumeric = NUMERIC_LABEL.test(a)
  const bNumeric = NUMERIC_LABEL.test(b)
  if (aNumeric && bNumeric) {
    const difference = Number(a) - Number(b)
    return difference !== 0 ? Math.sign(difference) : byCodeUnits(a, b)
  }
  if (aNumeric !== bNumeric) return aNumeric ? -1 : 1
  return byCodeUnits(a, b)
}
