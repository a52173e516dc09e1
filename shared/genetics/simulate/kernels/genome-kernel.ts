import { genomeWasm } from './genome-wasm'
import { ensureMemoryBytes, kernelMemory, kernelModule } from './instantiate'

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

/**
 * The WebAssembly genome kernel (kernels/genome.ts): gamete words under free recombination, and
 * whole generations without immigrants, and founders' harmful copies, drawing from a `WordStream` relocated into its state words.
 *
 * Why: a gamete of the rescue model takes one random word per heterozygous 32-locus word
 * (about 70 for 2,200 loci); in TypeScript each costs a generator step on 32-bit halves, in
 * the kernel a step on two 64-bit words. Without immigrants the whole loop over offspring — parent
 * draws from the alias tables, gametes, new mutations, adaptive alleles — runs in one call
 * instead of a call per gamete and a dozen TypeScript helpers per offspring. The draws are the
 * same, in the same order.
 *
 * Use: `reserve` room, copy arrays in with `int32s`/`float64s`/`uint8s`, relocate the stream into
 * `state`, write gametes with `gamete` at the views' byte offsets or a generation with
 * `generation`, copy the children out. Growing the memory detaches every earlier view, so views
 * are taken after `reserve`.
 */
export class GenomeKernel {
  private readonly memory: WebAssembly.Memory
  private readonly gameteExport: GameteExport
  private readonly generationExport: GenerationExport
  private readonly placeCopiesExport: PlaceCopiesExport
  private nextFree = ARRAYS_BYTE

  constructor() {
    this.memory = kernelMemory(0)
    const instance = new WebAssembly.Instance(kernelModule(genomeWasm), { env: { memory: this.memory } })
    this.gameteExport = instance.exports.gamete as GameteExport
    this.generationExport = instance.exports.offspringGeneration as GenerationExport
    this.placeCopiesExport = instance.exports.placeCopies as PlaceCopiesExport
  }

  /** Frees every array and makes room for `bytes` bytes of arrays, each counted by `kernelArrayBytes` (views taken before are invalid). */
  reserve(bytes: number): void {
    this.nextFree = ARRAYS_BYTE
    ensureMemoryBytes(this.memory, ARRAYS_BYTE + bytes)
  }

  /** The generator state words, where a `WordStream` is relocated while the kernel draws. */
  state(): Int32Array {
    return new Int32Array(this.memory.buffer, 0, 4)
  }

  /** The next `length` int32 words of the reserved room, holding a copy of `from` if given. */
  int32s(length: number, from?: ArrayLike<number>): Int32Array {
    const view = new Int32Array(this.memory.buffer, this.take(length * 4), length)
    if (from) view.set(from)
    return view
  }

  /** The next `length` doubles of the reserved room, holding a copy of `from` if given. */
  float64s(length: number, from?: ArrayLike<number>): Float64Array {
    const view = new Float64Array(this.memory.buffer, this.take(length * 8), length)
    if (from) view.set(from)
    return view
  }

  /** The next `length` bytes of the reserved room, holding a copy of `from` if given. */
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
    this.gameteExport(markerFirst, markerOut, markerWords, loadFirst, loadOut, loadWords)
  }

  /** Writes a generation's offspring haplotypes, adaptive alleles and parent numbers (see `KernelGeneration`). */
  generation(job: KernelGeneration): void {
    const { females, males, parents, offspring } = job
    this.generationExport(
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
    this.placeCopiesExport(load.byteOffset, loadWords, haplotypes, word, bit, copies)
  }

  /** Byte address of the next `bytes` bytes of the reserved room (8-byte aligned). */
  private take(bytes: number): number {
    const at = this.nextFree
    this.nextFree += kernelArrayBytes(bytes)
    if (this.nextFree > this.memory.buffer.byteLength) throw new RangeError('GenomeKernel: more room taken than reserved')
    return at
  }
}
