import { alleleCountsWasm } from './allele-counts-wasm'
import { ensureMemoryBytes, kernelMemory, kernelModule } from './instantiate'

type CountAllelesExport = (bits: number, words: number, haplotypes: number, counts: number) => void

let memory: WebAssembly.Memory | undefined
let countAllelesExport: CountAllelesExport | undefined

/**
 * Allele counts per locus of a bitset population by the allele-count kernel
 * (kernels/allele-counts.ts): one instance per thread, its memory grown to the largest
 * population seen; the bitsets are copied in and the counts copied out, so no view of the
 * kernel's memory escapes.
 *
 * @param bits - haplotype bitsets, `haplotypes × words` 32-bit words
 * @param words - words per haplotype
 * @param haplotypes - number of haplotypes
 * @returns a new array of 32·words counts
 */
export function countAllelesInKernel(bits: Int32Array, words: number, haplotypes: number): Int32Array {
  const countsLength = words * 32
  const bitsLength = haplotypes * words
  const needed = (countsLength + bitsLength) * 4
  if (!memory || !countAllelesExport) {
    memory = kernelMemory(needed)
    countAllelesExport = new WebAssembly.Instance(kernelModule(alleleCountsWasm), { env: { memory } }).exports.countAlleles as CountAllelesExport
  } else {
    ensureMemoryBytes(memory, needed)
  }
  const counts = new Int32Array(memory.buffer, 0, countsLength)
  counts.fill(0)
  new Int32Array(memory.buffer, countsLength * 4, bitsLength).set(bits.subarray(0, bitsLength))
  countAllelesExport(countsLength * 4, words, haplotypes, 0)
  return counts.slice()
}
