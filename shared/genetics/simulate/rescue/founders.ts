import { sampleBinomial } from '../random/binomial'
import type { RandomStream } from '../random/streams'
import { uniformIndex } from '../random/uniform'
import { WordStream } from '../random/word-stream'
import { GenomeKernel, kernelArrayBytes } from '../kernels/genome-kernel'
import type { GenomeArchitecture } from './architecture'
import { allocatePopulation } from './population'
import type { Population } from './population'

/**
 * First generation of a burn-in: `size` individuals whose haplotypes are
 * independent draws from a large ancestral population in linkage
 * equilibrium — markers at frequency ½ (32 random bits per word), each load
 * locus at its mutation–selection balance frequency (`equilibriumFrequency`).
 * The recipient and the source both start this way, so they share ancestral
 * allele frequencies and differ only by their own histories.
 *
 * Load loci: the number of harmful copies is Binomial(2·size, q̂) and the
 * carrying haplotypes are drawn uniformly (a collision leaves one copy fewer,
 * which is negligible at q̂ ≤ ½ and irrelevant after a burn-in).
 *
 * @param size - individuals, integer ≥ 2
 * @param architecture - genome layout and ancestral frequencies
 * @param random - the population's burn-in stream
 * @returns a new population without kinship
 */
export function foundingPopulation(size: number, architecture: GenomeArchitecture, random: RandomStream): Population {
  const population = allocatePopulation(size, architecture)
  const { markers, load } = population
  const markerWords = architecture.markerWords
  const lastMarkerBits = architecture.markerLoci - 32 * (markerWords - 1)
  const lastMask = lastMarkerBits === 32 ? -1 : (1 << lastMarkerBits) - 1
  for (let haplotype = 0; haplotype < 2 * size; haplotype++) {
    for (let word = 0; word < markerWords; word++) {
      const bits = random.next()
      markers[haplotype * markerWords + word] = word === markerWords - 1 ? bits & lastMask : bits
    }
  }
  if (random instanceof WordStream) placeLoadInKernel(load, size, architecture, random)
  else {
    const loadWords = architecture.loadWords
    for (let locus = 0; locus < architecture.loadLoci; locus++) {
      const copies = sampleBinomial(random, 2 * size, architecture.ancestralLoadFrequency[locus] ?? 0)
      const word = locus >> 5
      const bit = 1 << (locus & 31)
      for (let copy = 0; copy < copies; copy++) {
        const index = uniformIndex(random, 2 * size) * loadWords + word
        load[index] = (load[index] ?? 0) | bit
      }
    }
  }
  return population
}

/** The genome kernel that places founders' harmful copies (one per thread, created when first needed). */
let foundersKernel: GenomeKernel | null = null

/**
 * The load loop of `foundingPopulation` with each locus's copies placed by the genome kernel:
 * the stream moves into the kernel's state words, where the binomial draws (TypeScript) and the
 * placements (kernel) take their numbers in turn, in the same order as the TypeScript loop.
 */
function placeLoadInKernel(load: Int32Array, size: number, architecture: GenomeArchitecture, random: WordStream): void {
  const kernel = foundersKernel ??= new GenomeKernel()
  kernel.reserve(0, kernelArrayBytes(load.length * 4))
  const staged = kernel.int32s(load.length).fill(0)
  const loadWords = architecture.loadWords
  random.relocate(kernel.state())
  try {
    for (let locus = 0; locus < architecture.loadLoci; locus++) {
      const copies = sampleBinomial(random, 2 * size, architecture.ancestralLoadFrequency[locus] ?? 0)
      if (copies > 0) kernel.placeCopies(staged, loadWords, 2 * size, locus >> 5, 1 << (locus & 31), copies)
    }
  } finally {
    random.returnHome()
  }
  load.set(staged)
}

/**
 * Gives every haplotype the adaptive allele A independently with probability
 * `frequency` (Hardy–Weinberg genotypes), replacing what was there.
 *
 * @param population - modified in place
 * @param frequency - in [0, 1]
 * @param random - seeded generator
 */
export function assignAdaptiveAlleles(population: Population, frequency: number, random: RandomStream): void {
  const { adaptive } = population
  for (let haplotype = 0; haplotype < adaptive.length; haplotype++) {
    adaptive[haplotype] = frequency > 0 && random.next() >>> 0 < frequency * 4294967296 ? 1 : 0
  }
}
