import type { GenomeArchitecture } from './architecture'
import type { Population } from './population'
import { FitnessKernel } from '../kernels/fitness-kernel'

/** One fitness kernel per genome architecture (and thread), holding its tables. */
const kernels = new WeakMap<GenomeArchitecture, FitnessKernel>()

function fitnessKernelFor(architecture: GenomeArchitecture): FitnessKernel {
  let kernel = kernels.get(architecture)
  if (!kernel) {
    kernel = new FitnessKernel(architecture.loadWords, architecture.byteLogHomozygous, architecture.byteLogHeterozygous)
    kernels.set(architecture, kernel)
  }
  return kernel
}

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
 * word, added left to right. Cost O(N × loadWords). Lethal homozygotes get
 * fitness 0 (ln 0 = −∞). The sums run in the fitness kernel
 * (kernels/fitness.ts) word by word across all individuals rather than
 * individual by individual (each individual still adds its words in order,
 * so the values are the same): one word's tables (16 kB) then stay in the
 * nearest cache for the whole population instead of all tables (about
 * 1 MB for 2000 loci) being swept once per individual.
 *
 * @param population - individuals to evaluate
 * @param architecture - byte tables of ln(1 − s) and ln(1 − h·s)
 * @param adaptive - selection on the adaptive locus, or null
 * @returns a new array of fitness values ≥ 0, one per individual
 */
export function evaluateFitness(population: Population, architecture: GenomeArchitecture, adaptive: AdaptiveSelection | null): Float64Array {
  const { size, load } = population
  const fitness = size > 0 && architecture.loadWords > 0 ? fitnessKernelFor(architecture).logFitness(load, size) : new Float64Array(size)
  const heterozygote = adaptive ? 1 + adaptive.h * adaptive.s : 1
  const homozygote = adaptive ? 1 + adaptive.s : 1
  for (let individual = 0; individual < size; individual++) {
    const copies = (population.adaptive[2 * individual] as number) + (population.adaptive[2 * individual + 1] as number)
    fitness[individual] = Math.exp(fitness[individual] as number) * (copies === 2 ? homozygote : copies === 1 ? heterozygote : 1)
  }
  return fitness
}
