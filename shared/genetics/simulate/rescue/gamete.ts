import { samplePoisson } from '../random/poisson'
import type { RandomStream } from '../random/streams'
import { uniform01, uniformIndex } from '../random/uniform'
import type { GenomeArchitecture } from './architecture'
import { writeChromosomeMask } from './linkage'
import type { Population } from './population'
import type { GenomeKernel } from '../kernels/genome-kernel'

/** Reusable buffers for gamete formation under a genetic map. */
export interface GameteScratch {
  markerMask: Int32Array
  loadMask: Int32Array
  crossovers: Float64Array
  /**
   * Set while `reproduce` keeps the haplotypes in this kernel's memory and the stream in its
   * state words (free recombination only): the gamete words are then written there.
   */
  kernel: GenomeKernel | null
}

/**
 * Allocates the buffers `writeGamete` needs.
 *
 * @param architecture - genome layout
 * @returns scratch buffers
 */
export function gameteScratch(architecture: GenomeArchitecture): GameteScratch {
  return {
    markerMask: new Int32Array(architecture.markerWords),
    loadMask: new Int32Array(architecture.loadWords),
    crossovers: new Float64Array(64),
    kernel: null,
  }
}

/**
 * Writes one gamete of `parent` into haplotype `slot` of `child`.
 *
 * Meiosis: with free recombination each locus comes from either parental
 * haplotype with probability ½ independently — one random 32-bit word per
 * word of loci where the parent is heterozygous (homozygous words are copied
 * as they are). Under a genetic map each chromosome gets Poisson(length)
 * crossovers at uniform positions and a random starting haplotype. Then
 * Poisson(U) new harmful mutations hit uniformly chosen load loci (a hit on
 * a locus already carrying the harmful allele changes nothing; no back
 * mutation), and the adaptive allele is taken from a random parental
 * haplotype (unlinked). With `scratch.kernel` set, the word loops run in the
 * genome kernel, which draws the same words from the same stream.
 *
 * @param parent - population of the parent
 * @param parentIndex - the parent's index
 * @param child - population being written
 * @param childIndex - the child's index
 * @param slot - 0 (maternal) or 1 (paternal) haplotype of the child
 * @param architecture - genome layout, map and mutation rate
 * @param random - seeded generator
 * @param scratch - buffers from `gameteScratch`
 */
export function writeGamete(
  parent: Population,
  parentIndex: number,
  child: Population,
  childIndex: number,
  slot: number,
  architecture: GenomeArchitecture,
  random: RandomStream,
  scratch: GameteScratch,
): void {
  const { markerWords, loadWords } = architecture
  const linked = architecture.markerLayout !== null
  if (linked) fillMapMasks(architecture, random, scratch)

  const markerFrom = parent.markers
  const markerTo = child.markers
  const firstMarker = 2 * parentIndex * markerWords
  const secondMarker = firstMarker + markerWords
  const markerOut = (2 * childIndex + slot) * markerWords
  const kernel = scratch.kernel
  if (kernel !== null) {
    const firstLoad = 2 * parentIndex * loadWords
    kernel.gamete(markerFrom.byteOffset + 4 * firstMarker, markerTo.byteOffset + 4 * markerOut, markerWords,
      parent.load.byteOffset + 4 * firstLoad, child.load.byteOffset + 4 * (2 * childIndex + slot) * loadWords, loadWords)
    finishGamete(parent, parentIndex, child, childIndex, slot, architecture, random)
    return
  }
  // Hot loop: every index below lies inside a haplotype of the given
  // individuals by construction, hence the `as number` reads.
  for (let word = 0; word < markerWords; word++) {
    const a = markerFrom[firstMarker + word] as number
    const difference = a ^ (markerFrom[secondMarker + word] as number)
    markerTo[markerOut + word] = difference === 0
      ? a
      : a ^ (difference & (linked ? scratch.markerMask[word] as number : random.next()))
  }

  if (loadWords > 0) {
    const loadFrom = parent.load
    const loadTo = child.load
    const firstLoad = 2 * parentIndex * loadWords
    const secondLoad = firstLoad + loadWords
    const loadOut = (2 * childIndex + slot) * loadWords
    const loadLinked = architecture.loadLayout !== null
    for (let word = 0; word < loadWords; word++) {
      const a = loadFrom[firstLoad + word] as number
      const difference = a ^ (loadFrom[secondLoad + word] as number)
      loadTo[loadOut + word] = difference === 0
        ? a
        : a ^ (difference & (loadLinked ? scratch.loadMask[word] as number : random.next()))
    }
  }
  finishGamete(parent, parentIndex, child, childIndex, slot, architecture, random)
}

/**
 * The rest of a gamete once its words are written: Poisson(U) new harmful
 * mutations at uniform load loci, then the adaptive allele from a random
 * parental haplotype (see `writeGamete`).
 */
function finishGamete(parent: Population, parentIndex: number, child: Population, childIndex: number, slot: number, architecture: GenomeArchitecture, random: RandomStream): void {
  const loadWords = architecture.loadWords
  if (loadWords > 0 && architecture.mutationRate > 0) {
    const loadTo = child.load
    const loadOut = (2 * childIndex + slot) * loadWords
    const mutations = samplePoisson(random, architecture.mutationRate)
    for (let mutation = 0; mutation < mutations; mutation++) {
      const locus = uniformIndex(random, architecture.loadLoci)
      const index = loadOut + (locus >> 5)
      loadTo[index] = (loadTo[index] as number) | (1 << (locus & 31))
    }
  }
  child.adaptive[2 * childIndex + slot] = parent.adaptive[2 * parentIndex + (random.next() & 1)] as number
}

/** Crossover masks of one meiosis under the genetic map. */
function fillMapMasks(architecture: GenomeArchitecture, random: RandomStream, scratch: GameteScratch): void {
  scratch.markerMask.fill(0)
  scratch.loadMask.fill(0)
  for (let chromosome = 0; chromosome < architecture.chromosomes; chromosome++) {
    const count = samplePoisson(random, architecture.chromosomeLength)
    if (count > scratch.crossovers.length) scratch.crossovers = new Float64Array(2 * count)
    for (let i = 0; i < count; i++) scratch.crossovers[i] = uniform01(random) * architecture.chromosomeLength
    const crossovers = scratch.crossovers.subarray(0, count).sort()
    const startOnSecond = (random.next() & 1) === 1
    if (architecture.markerLayout) writeChromosomeMask(scratch.markerMask, architecture.markerLayout, chromosome, crossovers, count, startOnSecond)
    if (architecture.loadLayout) writeChromosomeMask(scratch.loadMask, architecture.loadLayout, chromosome, crossovers, count, startOnSecond)
  }
}
