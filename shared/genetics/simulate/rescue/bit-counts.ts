import { countAllelesInKernel } from '../kernels/allele-counts-kernel'

/**
 * Number of haplotypes carrying each locus's bit, for every locus of a
 * bitset population (allele counts behind H, q and B).
 *
 * Method (in the allele-count kernel, kernels/allele-counts.ts):
 * SIMD-within-a-register counting, one 32-locus word at a time
 * down all haplotypes, with every counter in a local variable. Four
 * accumulators hold eight 4-bit counters each (accumulator k counts bits
 * k, k+4, …, k+28): a haplotype adds (word >>> k) & 0x11111111 to
 * accumulator k (int32 sums, wrapping like the bit patterns they are) —
 * 12 operations per haplotype-word, no memory traffic but the read. Every
 * 15 haplotypes the nibbles are split into eight 8-bit accumulators (bits
 * k, k+8, k+16, k+24), and every 255 those are added into the 32-bit
 * counts, before any lane can overflow.
 *
 * @param bits - haplotype bitsets, `haplotypes × words` 32-bit words
 * @param words - words per haplotype
 * @param haplotypes - number of haplotypes (2N), integer ≥ 0
 * @param loci - loci to report (≤ 32·words)
 * @returns a new Int32Array of per-locus counts in [0, haplotypes]
 * @example countAlleles(Int32Array.of(0b101, 0b100), 1, 2, 3) // Int32Array [1, 0, 2]
 */
export function countAlleles(bits: Int32Array, words: number, haplotypes: number, loci: number): Int32Array {
  const counts = countAllelesInKernel(bits, words, haplotypes)
  return counts.length === loci ? counts : counts.slice(0, loci)
}
