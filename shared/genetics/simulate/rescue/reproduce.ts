import type { RandomStream } from '../random/streams'
import { WordStream } from '../random/word-stream'
import { GenomeKernel, kernelArrayBytes, slotBytes } from '../kernels/genome-kernel'
import type { HaplotypeShape, KernelGeneration, KernelHaplotypes, KernelSamplerTables } from '../kernels/genome-kernel'
import { POISSON_MULTIPLICATION_LIMIT } from '../random/poisson'
import { KinshipKernel } from '../kernels/kinship-kernel'
import { uniform01, uniformIndex } from '../random/uniform'
import { WeightedSampler } from '../random/weighted-sampler'
import type { GenomeArchitecture } from './architecture'
import { matingWeights, reproductiveWeightShape } from './family-weights'
import { writeGamete } from './gamete'
import type { GameteScratch } from './gamete'
import { offspringPedigree } from './pedigree'
import { allocatePopulation, sexesOf } from './population'
import type { Population } from './population'

/** Immigrant parents from a source population (continuing migration). */
export interface ImmigrantSupply {
  source: Population
  /** m: probability that a given parent of a given offspring is an immigrant. */
  rate: number
}

/** Buffers reused from generation to generation. */
export interface ReproductionScratch {
  gamete: GameteScratch
  /** The kinship kernel whose two matrices this lineage's pedigrees use in turn (the breeding generation's pedigree holds one, the offspring's gets the other). */
  kinship: KinshipKernel
  /** The genome kernel used for this lineage's gametes (see `reproduce`). */
  genome: GenomeKernel
}

/**
 * Fresh reusable buffers for one lineage of generations.
 *
 * @param gamete - gamete buffers
 * @returns scratch with a kinship kernel and a genome kernel
 */
export function reproductionScratch(gamete: GameteScratch): ReproductionScratch {
  return { gamete, kinship: new KinshipKernel(), genome: new GenomeKernel() }
}

/**
 * Produces the next generation (discrete, non-overlapping generations).
 *
 * Each offspring has a mother drawn from the females and a father from the
 * males, each with probability proportional to fitness × a Gamma(α)
 * reproductive weight (α from `reproductiveWeightShape` for the target
 * Ne = effectiveRatio × parents); under continuing migration each parent is
 * instead, with probability m, a random adult of that sex from the source.
 * Selection is thus on fecundity/viability of parents (the usual
 * Wright–Fisher individual-based scheme). The first ⌈N/2⌉ offspring are
 * female. Gametes by `writeGamete`; the offspring's pedigree (kinship among
 * the parents that bred) by `offspringPedigree` when the parents carry one.
 *
 * Under free recombination with a `WordStream` the offspring's haplotype
 * arrays are views of the lineage's genome kernel (`scratch.genome`): they
 * stay valid until the generation after next is written with this scratch.
 *
 * @param parents - breeding adults (residents plus any translocated animals)
 * @param parentFitness - fitness of each parent (from `evaluateFitness`)
 * @param offspringCount - next generation's census, integer ≥ 2
 * @param effectiveRatio - target Ne/N in (0, 1]
 * @param architecture - genome layout
 * @param immigrants - continuing migration, or null
 * @param random - seeded generator
 * @param scratch - reusable buffers
 * @returns the offspring, or null if a sex has no parent with positive fitness (extinction)
 */
export function reproduce(
  parents: Population,
  parentFitness: Float64Array,
  offspringCount: number,
  effectiveRatio: number,
  architecture: GenomeArchitecture,
  immigrants: ImmigrantSupply | null,
  random: RandomStream,
  scratch: ReproductionScratch,
): Population | null {
  const females: number[] = []
  const males: number[] = []
  for (let i = 0; i < parents.size; i++) (parents.male[i] === 1 ? males : females).push(i)
  if (females.length === 0 || males.length === 0) return null
  const targetEffectiveSize = effectiveRatio * parents.size
  const femaleSampler = samplerFor(females, parentFitness, reproductiveWeightShape(females.length, targetEffectiveSize), random)
  const maleSampler = samplerFor(males, parentFitness, reproductiveWeightShape(males.length, targetEffectiveSize), random)
  if (!femaleSampler || !maleSampler) return null

  const immigrantFemales: number[] = []
  const immigrantMales: number[] = []
  const immigration = immigrants !== null && immigrants.rate > 0
  if (immigration) {
    for (let i = 0; i < immigrants.source.size; i++) (immigrants.source.male[i] === 1 ? immigrantMales : immigrantFemales).push(i)
  }
  const trackKinship = parents.pedigree !== null
  const mothers = new Int32Array(offspringCount)
  const fathers = new Int32Array(offspringCount)
  // Immigrants get parent numbers P, P+1, … in order of first use (kinship only).
  const immigrantNumber = new Map<number, number>()
  const kernelReady = architecture.markerLayout === null && architecture.loadLayout === null && random instanceof WordStream
  let offspring: Population
  if (kernelReady && !immigration && architecture.mutationRate < POISSON_MULTIPLICATION_LIMIT) {
    offspring = writeGenerationInKernel(scratch.genome, parents, offspringCount, femaleSampler, maleSampler, mothers, fathers, architecture, random)
  } else {
    // Under free recombination with a relocatable stream, the gamete words are written by the genome
    // kernel: parents, immigrant source and offspring haplotypes are placed in its memory and the
    // stream's state moves into its state words for the loop (same draws, same order).
    const staged = kernelReady ? stageInKernel(scratch.genome, parents, immigrants?.source ?? null, offspringCount, architecture, random) : null
    offspring = staged ? staged.offspring : allocatePopulation(offspringCount, architecture)
    const breeding = staged ? staged.parents : parents
    const donors = staged?.source ?? immigrants?.source ?? null
    scratch.gamete.kernel = staged ? scratch.genome : null
    const numberImmigrant = (sourceIndex: number): number => {
      const known = immigrantNumber.get(sourceIndex)
      if (known !== undefined) return known
      const assigned = parents.size + immigrantNumber.size
      immigrantNumber.set(sourceIndex, assigned)
      return assigned
    }
    try {
      for (let child = 0; child < offspringCount; child++) {
        for (let slot = 0; slot < 2; slot++) {
          const pool = slot === 0 ? immigrantFemales : immigrantMales
          if (pool.length > 0 && immigrants && donors && uniform01(random) < immigrants.rate) {
            const sourceIndex = pool[uniformIndex(random, pool.length)] as number // index < pool.length
            writeGamete(donors, sourceIndex, offspring, child, slot, architecture, random, scratch.gamete)
            if (trackKinship) (slot === 0 ? mothers : fathers)[child] = numberImmigrant(sourceIndex)
          } else {
            const parent = (slot === 0 ? femaleSampler : maleSampler).draw(random)
            writeGamete(breeding, parent, offspring, child, slot, architecture, random, scratch.gamete)
            if (trackKinship) (slot === 0 ? mothers : fathers)[child] = parent
          }
        }
      }
    } finally {
      // The stream goes back to its own words whatever happens, so that it stays usable.
      staged?.stream.returnHome()
      scratch.gamete.kernel = null
    }
  }
  if (parents.pedigree) {
    const kinship = scratch.kinship
    offspring.pedigree = offspringPedigree(parents.pedigree, mothers, fathers, immigrantNumber.size, (parentKinship, parentCount, memberMothers, memberFathers) =>
      kinship.offspringKinship(parentKinship, parentCount, memberMothers, memberFathers))
  }
  return offspring
}

/** Draws parent indices of one sex in proportion to their mating weights. */
class ParentSampler {
  /**
   * @param indices - the parents of this sex: column c of the sampler is parent indices[c]
   * @param sampler - alias tables over their mating weights
   */
  constructor(readonly indices: Int32Array, readonly sampler: WeightedSampler) {}

  /** A parent index, in proportion to its weight. */
  draw(random: RandomStream): number {
    return this.indices[this.sampler.sample(random)] as number // sample < indices.length
  }
}

function samplerFor(indices: number[], fitness: Float64Array, shape: number, random: RandomStream): ParentSampler | null {
  const ownFitness = new Float64Array(indices.length)
  for (let i = 0; i < indices.length; i++) ownFitness[i] = fitness[indices[i] as number] ?? 0
  const weights = matingWeights(ownFitness, shape, random)
  let total = 0
  for (const weight of weights) total += weight
  if (!(total > 0)) return null
  return new ParentSampler(Int32Array.from(indices), new WeightedSampler(weights))
}

/** Int32 words and bytes of a population's haplotype arrays. */
function haplotypeShape(size: number, architecture: GenomeArchitecture): HaplotypeShape {
  return { markers: size * 2 * architecture.markerWords, load: size * 2 * architecture.loadWords, adaptive: size * 2 }
}

/** A new population of `size` (first ⌈size/2⌉ female) whose haplotype arrays are the given views. */
function populationOn(size: number, haplotypes: KernelHaplotypes): Population {
  return { size, male: sexesOf(size), markers: haplotypes.markers, load: haplotypes.load, adaptive: haplotypes.adaptive, pedigree: null }
}

/**
 * Reserves the kernel's slots for the parents and `offspringCount` offspring and `scratchBytes` of
 * scratch, and places the parents in a slot (in place when they are the lineage's last offspring).
 *
 * @returns the parents' views and the other slot's views for the offspring
 */
function placeInSlots(kernel: GenomeKernel, parents: Population, offspringCount: number, architecture: GenomeArchitecture, scratchBytes: number): { parents: KernelHaplotypes, offspring: KernelHaplotypes } {
  const offspringShape = haplotypeShape(offspringCount, architecture)
  kernel.reserve(Math.max(slotBytes(haplotypeShape(parents.size, architecture)), slotBytes(offspringShape)), scratchBytes)
  const placed = kernel.parentsInSlot(parents)
  return { parents: placed.haplotypes, offspring: kernel.slotViews(1 - placed.slot, offspringShape) }
}

/**
 * `reproduce`'s loop without immigrants, run whole by the genome kernel: the parents' haplotypes
 * are used where they are when they are the lineage's last offspring (else copied into a slot),
 * both samplers' alias tables are copied into its scratch, the stream moves into its state words,
 * and the offspring are written into the other slot — the same draws in the same order as the
 * TypeScript loop with `writeGamete`.
 *
 * @returns the offspring, whose haplotype arrays are views of the kernel's memory
 */
function writeGenerationInKernel(
  kernel: GenomeKernel,
  parents: Population,
  offspringCount: number,
  females: ParentSampler,
  males: ParentSampler,
  mothers: Int32Array,
  fathers: Int32Array,
  architecture: GenomeArchitecture,
  random: WordStream,
): Population {
  const samplerBytes = (sampler: ParentSampler): number => 2 * kernelArrayBytes(sampler.indices.length * 4) + kernelArrayBytes(sampler.indices.length * 8)
  const slots = placeInSlots(kernel, parents, offspringCount, architecture,
    samplerBytes(females) + samplerBytes(males) + 2 * kernelArrayBytes(mothers.length * 4))
  const tables = (sampler: ParentSampler): KernelSamplerTables => ({
    indices: kernel.int32s(sampler.indices.length, sampler.indices),
    threshold: kernel.float64s(sampler.indices.length, sampler.sampler.threshold),
    alias: kernel.int32s(sampler.indices.length, sampler.sampler.alias),
  })
  const job: KernelGeneration = {
    count: offspringCount,
    females: tables(females),
    males: tables(males),
    parents: slots.parents,
    offspring: slots.offspring,
    markerWords: architecture.markerWords,
    loadWords: architecture.loadWords,
    mutationLimit: architecture.loadWords > 0 && architecture.mutationRate > 0 ? Math.exp(-architecture.mutationRate) : null,
    loadLoci: architecture.loadLoci,
    mothers: kernel.int32s(mothers.length),
    fathers: kernel.int32s(fathers.length),
  }
  random.relocate(kernel.state())
  try {
    kernel.generation(job)
  } finally {
    random.returnHome()
  }
  mothers.set(job.mothers)
  fathers.set(job.fathers)
  return populationOn(offspringCount, slots.offspring)
}

/** Populations whose haplotype arrays are views of a genome kernel's memory. */
interface StagedPopulations {
  parents: Population
  source: Population | null
  offspring: Population
  /** The stream, relocated into the kernel's state words. */
  stream: WordStream
}

/**
 * Places the parents in a slot of the kernel's memory (where they are, when they are the lineage's
 * last offspring), copies the source's haplotypes into its scratch, takes the other slot for the
 * offspring, and moves the stream into the kernel's state words. The returned parents and source
 * share everything else with the originals; the caller calls `random.returnHome()` when the
 * gametes are written.
 */
function stageInKernel(kernel: GenomeKernel, parents: Population, source: Population | null, offspringCount: number, architecture: GenomeArchitecture, random: WordStream): StagedPopulations {
  const slots = placeInSlots(kernel, parents, offspringCount, architecture,
    source ? kernelArrayBytes(source.markers.length * 4) + kernelArrayBytes(source.load.length * 4) : 0)
  const staged = {
    parents: { ...parents, markers: slots.parents.markers, load: slots.parents.load },
    source: source ? { ...source, markers: kernel.int32s(source.markers.length, source.markers), load: kernel.int32s(source.load.length, source.load) } : null,
    offspring: populationOn(offspringCount, slots.offspring),
    stream: random,
  }
  random.relocate(kernel.state())
  return staged
}
