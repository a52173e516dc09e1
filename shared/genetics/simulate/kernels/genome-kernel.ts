import { genomeWasm } from './genome-wasm'
import { kernelMemory, kernelModule } from './instantiate'

/** First byte of the arrays (bytes 0–15 hold the generator state). */
const ARRAYS_BYTE = 16

type GameteExport = (markerFirst: number, markerOut: number, markerWords: number, loadFirst: number, loadOut: number, loadWords: number) => void
type PlaceCopiesExport = (load: number, loadWords: number, haplotypes: number, word: number, bit: number, copies: number) => void
type GenerationExport = (
  count: number,
  femaleIndices: number, femaleThreshold: number, femaleAlias: number, femaleSize: number,
  maleIndices: number, maleThreshold: number, maleAlias: number, maleSize: number,
  parentMarkers: number, parentLoad: number, parentAdaptive: number,
  childMarkers: number, childLoad: number, childAdaptive: number,
  markerWords: number, loadWords: number,
  mutate: number, mutationLimit: number, loadLoci: number,
  mothers: number, fathers: number,
) => void

/** The genome kernel's exported functions. */
interface GenomeExports {
  gamete: GameteExport
  generation: GenerationExport
  placeCopies: PlaceCopiesExport
}

/** Bytes an array of `bytes` takes in the kernel's memory (arrays start on 8-byte boundaries). */
export function kernelArrayBytes(bytes: number): number {
  return Math.ceil(bytes / 8) * 8
}

/** A parent sampler's alias tables in the kernel's memory: column c is parent indices[c]. */
export interface KernelSamplerTables {
  indices: Int32Array
  threshold: Float64Array
  alias: Int32Array
}

/** Haplotype arrays of a population in the kernel's memory (see `Population`). */
export interface KernelHaplotypes {
  markers: Int32Array
  load: Int32Array
  adaptive: Uint8Array
}

/** Everything `generation` reads and writes; every array is a view of this kernel's memory. */
export interface KernelGeneration {
  count: number
  females: KernelSamplerTables
  males: KernelSamplerTables
  parents: KernelHaplotypes
  offspring: KernelHaplotypes
  markerWords: number
  loadWords: number
  /** e^−U for Poisson(U) new mutations per gamete (U below the multiplication limit), or null for none. */
  mutationLimit: number | null
  loadLoci: number
  mothers: Int32Array
  fathers: Int32Array
}

/** Int32 marker words, int32 load words and adaptive bytes of a population of `size` individuals. */
export interface HaplotypeShape {
  markers: number
  load: number
  adaptive: number
}

/** Bytes a population of this shape takes in a slot. */
export function slotBytes(shape: HaplotypeShape): number {
  return kernelArrayBytes(shape.markers * 4) + kernelArrayBytes(shape.load * 4) + kernelArrayBytes(shape.adaptive)
}

/**
 * The WebAssembly genome kernel (kernels/genome.ts): gamete words under free recombination,
 * whole generations without immigrants, and founders' harmful copies, drawing from a
 * `WordStream` relocated into its state words.
 *
 * Why: a gamete of the rescue model takes one random word per heterozygous 32-locus word
 * (about 70 for 2,200 loci); in TypeScript each costs a generator step on 32-bit halves, in
 * the kernel a step on two 64-bit words. Without immigrants the whole loop over offspring — parent
 * draws from the alias tables, gametes, new mutations, adaptive alleles — runs in one call
 * instead of a call per gamete and a dozen TypeScript helpers per offspring. The draws are the
 * same, in the same order.
 *
 * Memory: the state words (bytes 0–15), two population slots used in turn by a lineage of
 * generations, then scratch. A generation's offspring are written into one slot and handed out
 * as views (no copy, no new arrays); the next generation finds its parents there and writes into
 * the other slot, so a population stays valid until the generation after next is written. When a
 * generation needs more room, a new, larger memory replaces the old one instead of growing it
 * (growing would detach every view handed out), and the old memory lives on as long as views of
 * it do.
 *
 * Use: `reserve` room, place the parents with `parentsInSlot` and take the other slot for the
 * offspring with `slotViews`, take scratch with `int32s`/`float64s`/`uint8s`, relocate the stream
 * into `state`, then `gamete` (at views' byte offsets) or `generation`.
 */
export class GenomeKernel {
  private memory: WebAssembly.Memory
  /** The kernel's functions, bound to `memory`. */
  private exports: GenomeExports
  /** Bytes per population slot. */
  private slotCapacity = 0
  /** Next free byte of scratch, and its end. */
  private nextFree = ARRAYS_BYTE
  private scratchEnd = ARRAYS_BYTE

  constructor() {
    this.memory = kernelMemory(0)
    this.exports = this.instantiate()
  }

  /**
   * Room for two population slots of `populationBytes` (see `slotBytes`) and `scratchBytes` of
   * scratch (each array counted by `kernelArrayBytes`); scratch taken before is freed. Keeps the
   * memory, and the slots' contents, when they fit; otherwise replaces it with a larger one.
   */
  reserve(populationBytes: number, scratchBytes: number): void {
    if (populationBytes > this.slotCapacity || this.scratchStart(this.slotCapacity) + scratchBytes > this.memory.buffer.byteLength) {
      const capacity = Math.max(this.slotCapacity, Math.ceil(populationBytes * 1.25 / 8) * 8)
      this.slotCapacity = capacity
      this.memory = kernelMemory(Math.ceil((this.scratchStart(capacity) + scratchBytes) * 1.25))
      this.exports = this.instantiate()
    }
    this.nextFree = this.scratchStart(this.slotCapacity)
    this.scratchEnd = this.memory.buffer.byteLength
  }

  /**
   * The parents' haplotypes in a slot: where they already are, when they are views of a slot of
   * this memory (the offspring of this lineage's last generation); otherwise copied into slot 0.
   *
   * @returns the slot (0 or 1) and the views
   */
  parentsInSlot(parents: KernelHaplotypes): { slot: number, haplotypes: KernelHaplotypes } {
    const shape = { markers: parents.markers.length, load: parents.load.length, adaptive: parents.adaptive.length }
    for (let slot = 0; slot < 2; slot++) {
      const views = this.slotViews(slot, shape)
      if (sameView(views.markers, parents.markers) && sameView(views.load, parents.load) && sameView(views.adaptive, parents.adaptive)) return { slot, haplotypes: views }
    }
    const views = this.slotViews(0, shape)
    views.markers.set(parents.markers)
    views.load.set(parents.load)
    views.adaptive.set(parents.adaptive)
    return { slot: 0, haplotypes: views }
  }

  /** Views of slot `slot` for a population of this shape (contents as left there). */
  slotViews(slot: number, shape: HaplotypeShape): KernelHaplotypes {
    const start = ARRAYS_BYTE + slot * this.slotCapacity
    const loadStart = start + kernelArrayBytes(shape.markers * 4)
    const adaptiveStart = loadStart + kernelArrayBytes(shape.load * 4)
    return {
      markers: new Int32Array(this.memory.buffer, start, shape.markers),
      load: new Int32Array(this.memory.buffer, loadStart, shape.load),
      adaptive: new Uint8Array(this.memory.buffer, adaptiveStart, shape.adaptive),
    }
  }

  /** The generator state words, where a `WordStream` is relocated while the kernel draws. */
  state(): Int32Array {
    return new Int32Array(this.memory.buffer, 0, 4)
  }

  /** The next `length` int32 words of scratch, holding a copy of `from` if given. */
  int32s(length: number, from?: ArrayLike<number>): Int32Array {
    const view = new Int32Array(this.memory.buffer, this.take(length * 4), length)
    if (from) view.set(from)
    return view
  }

  /** The next `length` doubles of scratch, holding a copy of `from` if given. */
  float64s(length: number, from?: ArrayLike<number>): Float64Array {
    const view = new Float64Array(this.memory.buffer, this.take(length * 8), length)
    if (from) view.set(from)
    return view
  }

  /** The next `length` bytes of scratch, holding a copy of `from` if given. */
  uint8s(length: number, from?: ArrayLike<number>): Uint8Array {
    const view = new Uint8Array(this.memory.buffer, this.take(length), length)
    if (from) view.set(from)
    return view
  }

  /**
   * The marker and load words of one gamete: each from the parent's two haplotypes, which start
   * at markerFirst (markerWords words each, one after the other) and loadFirst, into markerOut
   * and loadOut (byte addresses in the kernel's memory, i.e. views' byteOffset plus 4 per word).
   */
  gamete(markerFirst: number, markerOut: number, markerWords: number, loadFirst: number, loadOut: number, loadWords: number): void {
    this.exports.gamete(markerFirst, markerOut, markerWords, loadFirst, loadOut, loadWords)
  }

  /** Writes a generation's offspring haplotypes, adaptive alleles and parent numbers (see `KernelGeneration`). */
  generation(job: KernelGeneration): void {
    const { females, males, parents, offspring } = job
    this.exports.generation(
      job.count,
      females.indices.byteOffset, females.threshold.byteOffset, females.alias.byteOffset, females.indices.length,
      males.indices.byteOffset, males.threshold.byteOffset, males.alias.byteOffset, males.indices.length,
      parents.markers.byteOffset, parents.load.byteOffset, parents.adaptive.byteOffset,
      offspring.markers.byteOffset, offspring.load.byteOffset, offspring.adaptive.byteOffset,
      job.markerWords, job.loadWords,
      job.mutationLimit === null ? 0 : 1, job.mutationLimit ?? 0, job.loadLoci,
      job.mothers.byteOffset, job.fathers.byteOffset,
    )
  }

  /**
   * Gives `copies` haplotypes drawn uniformly (with replacement) among `haplotypes` the bits `bit`
   * of their load word `word` (`load`: the haplotypes' words, a view of this kernel's memory).
   */
  placeCopies(load: Int32Array, loadWords: number, haplotypes: number, word: number, bit: number, copies: number): void {
    this.exports.placeCopies(load.byteOffset, loadWords, haplotypes, word, bit, copies)
  }

  /** First byte of scratch for slots of `capacity` bytes. */
  private scratchStart(capacity: number): number {
    return ARRAYS_BYTE + 2 * capacity
  }

  /** Byte address of the next `bytes` bytes of scratch (8-byte aligned). */
  private take(bytes: number): number {
    const at = this.nextFree
    this.nextFree += kernelArrayBytes(bytes)
    if (this.nextFree > this.scratchEnd) throw new RangeError('GenomeKernel: more scratch taken than reserved')
    return at
  }

  /** The kernel's functions on the current memory. */
  private instantiate(): GenomeExports {
    const { exports } = new WebAssembly.Instance(kernelModule(genomeWasm), { env: { memory: this.memory } })
    return {
      gamete: exports.gamete as GameteExport,
      generation: exports.offspringGeneration as GenerationExport,
      placeCopies: exports.placeCopies as PlaceCopiesExport,
    }
  }
}

/** Whether two views cover the same bytes of the same buffer. */
function sameView(a: ArrayBufferView, b: ArrayBufferView): boolean {
  return a.buffer === b.buffer && a.byteOffset === b.byteOffset && a.byteLength === b.byteLength
}
