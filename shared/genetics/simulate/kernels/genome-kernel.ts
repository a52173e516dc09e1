import { genomeWasm } from './genome-wasm'
import { ensureMemoryBytes, kernelMemory, kernelModule } from './instantiate'

/** First byte of the haplotype arrays (bytes 0–15 hold the generator state). */
const ARRAYS_BYTE = 16

type GameteExport = (markerFirst: number, markerOut: number, markerWords: number, loadFirst: number, loadOut: number, loadWords: number) => void

/**
 * The WebAssembly genome kernel (kernels/genome.ts): gamete words under free recombination,
 * drawing from a `WordStream` relocated into its state words.
 *
 * Why: a gamete of the rescue model takes one random word per heterozygous 32-locus word
 * (about 70 for 2,200 loci); in TypeScript each costs a generator step on 32-bit halves, in
 * the kernel a step on two 64-bit words. The draws are the same, in the same order.
 *
 * Use: `reserve` room, copy the parents' haplotypes into `words(…)` views, relocate the stream
 * into `state`, write gametes with `gamete` at the views' byte offsets, copy the children
 * out. Growing the memory detaches every earlier view, so views are taken after `reserve`.
 */
export class GenomeKernel {
  private readonly memory: WebAssembly.Memory
  private readonly gameteExport: GameteExport
  private nextFree = ARRAYS_BYTE

  constructor() {
    this.memory = kernelMemory(0)
    const instance = new WebAssembly.Instance(kernelModule(genomeWasm), { env: { memory: this.memory } })
    this.gameteExport = instance.exports.gamete as GameteExport
  }

  /** Frees every array and makes room for `words` int32 words of arrays (views taken before are invalid). */
  reserve(words: number): void {
    this.nextFree = ARRAYS_BYTE
    ensureMemoryBytes(this.memory, ARRAYS_BYTE + words * 4)
  }

  /** The generator state words, where a `WordStream` is relocated while the kernel draws. */
  state(): Int32Array {
    return new Int32Array(this.memory.buffer, 0, 4)
  }

  /** The next `length` words of the reserved room, holding a copy of `from` if given. */
  words(length: number, from?: Int32Array): Int32Array {
    const view = new Int32Array(this.memory.buffer, this.nextFree, length)
    this.nextFree += length * 4
    if (this.nextFree > this.memory.buffer.byteLength) throw new RangeError('GenomeKernel: more words taken than reserved')
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
}
