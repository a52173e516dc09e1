import { sampleGamma } from '../random/gamma'
import type { RandomStream } from '../random/streams'

/**
 * Shape α of the gamma-distributed reproductive weights of the parents of
 * one sex that makes two offspring share a parent of that sex with
 * probability 2/Ne — the rate of coalescence of an ideal population of size
 * Ne.
 *
 * Construction: each of the N offspring picks its mother (father) with
 * probability proportional to weight; weights g_i ~ Gamma(α) make the
 * choice probabilities Dirichlet(α, …, α) over the n parents of that sex, so
 * P(same parent) = Σ E[π_i²] = 1/n + (1 − 1/n)/(n·α + 1). Setting this to
 * 2/Ne gives α = [(1 − 1/n)/(2/Ne − 1/n) − 1]/n. With equal sexes
 * (n = N/2) and stable size this is the family-size variance
 * Vk = 4(N − 1)/Ne − 2, i.e. Ne·(N − ½)/(N − 1) by Wright's (1938) / Crow &
 * Kimura's (1970) Ne = (4N − 2)/(Vk + 2) [memory for attribution], within
 * 1/(2N) of the target. Fitness differences multiply the weights and lower
 * the realised Ne further (selection adds family-size variance).
 *
 * @param parents - n, parents of this sex, integer ≥ 1
 * @param targetEffectiveSize - Ne target for the whole population, > 0
 * @returns α > 0, or Infinity when the target needs no extra variance
 *   (Ne ≥ 2n: equal weights give P(same parent) = 1/n, Ne = 2n); α is held
 *   at ≥ 10⁻³ when the target is below what any weights can give (Ne < 2)
 * @example reproductiveWeightShape(50, 100) // Infinity (Poisson family sizes)
 * @example reproductiveWeightShape(50, 50)  // 0.96 (Ne = N = 100 would need none; Ne = 50 needs Vk ≈ 6)
 */
export function reproductiveWeightShape(parents: number, targetEffectiveSize: number): number {
  const sameParentIfEqual = 1 / parents
  const target = 2 / targetEffectiveSize
  if (target <= sameParentIfEqual) return Infinity
  const shape = ((1 - sameParentIfEqual) / (target - sameParentIfEqual) - 1) / parents
  return Math.max(1e-3, shape)
}

/**
 * Mating weight of each parent: fitness × Gamma(α) reproductive weight
 * (α = Infinity: weight = fitness).
 *
 * @param fitness - fitness per individual of this sex
 * @param shape - α from `reproductiveWeightShape`
 * @param random - seeded generator
 * @returns a new array of weights ≥ 0
 */
export function matingWeights(fitness: Float64Array, shape: number, random: RandomStream): Float64Array {
  const weights = new Float64Array(fitness.length)
  for (let i = 0; i < fitness.length; i++) {
    const value = fitness[i] ?? 0
    weights[i] = shape === Infinity || value === 0 ? value : value * sampleGamma(random, shape)
  }
  return weights
}
