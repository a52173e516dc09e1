import { fitnessWasm } from './fitness-wasm'
import { ensureMemoryBytes, kernelMemory, kernelModule } from './instantiate'

type LogFitnessExport = (haplotypes: number, size: number, words: number, hom: number, het: number, out: number) => void

/**
 * The WebAssembly fitness kernel (kernels/fitness.ts) for one genome architecture: its memory
 * holds the byte tables of ln(1 − s) and ln(1 − h·s) once, then a population's load haplotypes
 * and the log-fitness sums for each evaluation.
 *
 * Why: the sums are eight table lookups and eight additions per individual and 32-locus word,
 * a fifth of the rescue model's time in TypeScript (bounds checks on every lookup). The kernel
 * adds the same doubles in the same order, so the values are bit for bit the same.
 */
export class FitnessKernel {
  private readonly memory: WebAssembly.Memory
  private readonly logFitnessExport: LogFitnessExport
  private readonly words: number
  /** Bytes where the heterozygous tables start and where both tables end. */
  private readonly heterozygousByte: number
  private readonly tablesEnd: number

  /**
   * @param words - 32-locus load words per haplotype
   * @param homozygous - byte tables of ln(1 − s), 1024 doubles per word
   * @param heterozygous - byte tables of ln(1 − h·s), 1024 doubles per word
   */
  constructor(words: number, homozygous: Float64Array, heterozygous: Float64Array) {
    this.words = words
    this.heterozygousByte = homozygous.length * 8
    this.tablesEnd = this.heterozygousByte + heterozygous.length * 8
    this.memory = kernelMemory(this.tablesEnd)
    new Float64Array(this.memory.buffer, 0, homozygous.length).set(homozygous)
    new Float64Array(this.memory.buffer, this.heterozygousByte, heterozygous.length).set(heterozygous)
    const instance = new WebAssembly.Instance(kernelModule(fitnessWasm), { env: { memory: this.memory } })
    this.logFitnessExport = instance.exports.logFitness as LogFitnessExport
  }

  /**
   * Each individual's sum of log fitness over the load loci.
   *
   * @param load - load haplotypes of `size` individuals (2 × words int32 each)
   * @param size - number of individuals
   * @returns a new array of `size` sums (−∞ for a lethal homozygote)
   */
  logFitness(load: Int32Array, size: number): Float64Array {
    const sumsByte = this.tablesEnd
    const haplotypesByte = sumsByte + size * 8
    ensureMemoryBytes(this.memory, haplotypesByte + load.length * 4)
    new Int32Array(this.memory.buffer, haplotypesByte, load.length).set(load)
    this.logFitnessExport(haplotypesByte, size, this.words, 0, this.heterozygousByte, sumsByte)
    return new Float64Array(this.memory.buffer, sumsByte, size).slice()
  }
}
