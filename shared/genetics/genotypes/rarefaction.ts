/**
 * Probability that a given allele appears at least once in a random subsample
 * of g gene copies drawn without replacement from G copies, of which c are
 * that allele: 1 − C(G − c, g) / C(G, g)  (hypergeometric "not missed").
 *
 * Numerical care: the ratio of binomial coefficients is written as a product
 * of m = min(g, c) factors, C(G − c, g)/C(G, g) = Π_{j<m} (1 − k/(G − j)) with
 * k = max(g, c), summed in log space with log1p and mapped back with
 * −expm1(·). This is the log-gamma form of the ratio without the
 * cancellation of lnΓ differences: every term keeps full relative precision,
 * a tiny probability (c = 1, g ≪ G gives g/G) is not lost to 1 − (1 − x), and
 * nothing overflows for large G. Cost O(min(g, c)).
 *
 * Domain (checked by the caller): integers 1 ≤ g ≤ G, 0 ≤ c ≤ G.
 */
export function probabilityAlleleSampled(copies: number, geneCount: number, sampleSize: number): number {
  if (copies === 0) return 0
  // C(G − c, g) = 0: the subsample cannot avoid the allele.
  if (geneCount - copies < sampleSize) return 1
  const terms = Math.min(sampleSize, copies)
  const removed = Math.max(sampleSize, copies)
  let logMissed = 0
  for (let j = 0; j < terms; j++) logMissed += Math.log1p(-removed / (geneCount - j))
  return -Math.expm1(logMissed)
}

/**
 * Expected number of distinct alleles in a random subsample of g of the G
 * sampled gene copies (Hurlbert 1971 rarefaction, eq. 8.1 of SCIENCE.md):
 * A(g) = Σᵢ [1 − C(G − cᵢ, g)/C(G, g)].
 */
export function rarefiedAlleleCount(copies: readonly number[], sampleSize: number): number {
  let geneCount = 0
  for (const count of copies) geneCount += count
  let expected = 0
  for (const count of copies) expected += probabilityAlleleSampled(count, geneCount, sampleSize)
  return expected
}
