import type { GenomeArchitecture } from './architecture'
import type { Population } from './population'

/** Selection on the adaptive locus in a population (null where it is neutral). */
export interface AdaptiveSelection {
  s: number
  h: number
}

/**
 * Fitness of each individual under multiplicative effects across loci:
 * W = Π_l (1 − s_l)^[hom_l] (1 − h_l·s_l)^[het_l] × (1 + s_A, 1 + h_A·s_A or 1
 * for AA, Aa, aa at the adaptive locus).
 *
 * The log-fitness sums use byte lookup tables (`byteSums`): four lookups
 * for the homozygous and four for the heterozygous loci of each 32-locus
 * word. Cost O(N × loadWords). Lethal homozygotes get fitness 0
 * (ln 0 = −∞). The sums run word by word across all individuals rather
 * than individual by individual (each individual still adds its words in
 * the same order, so the values are the same): one word's tables then stay
 * in the nearest cache for the whole population instead of all tables
 * (about 1 MB for 2000 loci) being swept once per individual.
 *
 * @param population - individuals to evaluate
 * @param architecture - byte tables of ln(1 − s) and ln(1 − h·s)
 * @param adaptive - selection on the adaptive locus, or null
 * @returns a new array of fitness values ≥ 0, one per individual
 */
export function evaluateFitness(population: Population, architecture: GenomeArchitecture, adaptive: AdaptiveSelection | null): Float64Array {
  const { size, load } = population
  const words = architecture.loadWords
  const fitness = new Float64Array(size)
  const heterozygote = adaptive ? 1 + adaptive.h * adaptive.s : 1
  const homozygote = adaptive ? 1 + adaptive.s : 1
  const { byteLogHomozygous: homTable, byteLogHeterozygous: hetTable } = architecture
  const stride = 2 * words
  // Word by word across all individuals, so that one word's tables (16 kB)
  // stay in the nearest cache while every individual uses them; each
  // individual's sum still adds its words in order (the same value).
  // Hot loop: indices stay inside the bitsets and the 256-entry byte tables,
  // hence the `as number` reads.
  for (let word = 0; word < words; word++) {
    const table = word << 10
    for (let individual = 0, first = word; individual < size; individual++, first += stride) {
      const a = load[first] as number
      const b = load[first + words] as number
      const homozygous = a & b
      const heterozygous = a ^ b
      let logFitness = fitness[individual] as number
      // No test for empty words: entry 0 of every byte table is +0, and
      // x + 0 is x, so skipping them only cost mispredicted branches.
      logFitness += (homTable[table + (homozygous & 255)] as number) + (homTable[table + 256 + ((homozygous >>> 8) & 255)] as number)
        + (homTable[table + 512 + ((homozygous >>> 16) & 255)] as number) + (homTable[table + 768 + (homozygous >>> 24)] as number)
      logFitness += (hetTable[table + (heterozygous & 255)] as number) + (hetTable[table + 256 + ((heterozygous >>> 8) & 255)] as number)
        + (hetTable[table + 512 + ((heterozygous >>> 16) & 255)] as number) + (hetTable[table + 768 + (heterozygous >>> 24)] as number)
      fitness[individual] = logFitness
    }
  }
  for (let individual = 0; individual < size; individual++) {
    const copies = (population.adaptive[2 * individual] as number) + (population.adaptive[2 * individual + 1] as number)
    fitness[individual] = Math.exp(fitness[individual] as number) * (copies === 2 ? homozygote : copies === 1 ? heterozygote : 1)
  }
  return fitness
}
