/** Haplotypes added into 4-bit lanes before they move to 8-bit lanes (15 is the largest a nibble holds). */
const NIBBLE_CAPACITY = 15
/** Haplotypes added into 8-bit lanes before they are flushed (17 rounds of 15 = 255, the largest a byte holds). */
const BYTE_CAPACITY = 17 * NIBBLE_CAPACITY
const NIBBLE_ONES = 0x11111111
const LOW_NIBBLES = 0x0f0f0f0f

/**
 * Number of haplotypes carrying each locus's bit, for every locus of a
 * bitset population (allele counts behind H, q and B).
 *
 * Method: SIMD-within-a-register counting, one 32-locus word at a time
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
  const counts = new Int32Array(words * 32)
  // Hot loop: indices are inside the bitset and the counts by construction.
  for (let word = 0; word < words; word++) {
    const base = word << 5
    for (let byteStart = 0; byteStart < haplotypes; byteStart += BYTE_CAPACITY) {
      const byteEnd = Math.min(haplotypes, byteStart + BYTE_CAPACITY)
      // byteK: 8-bit lanes of bits k, k+8, k+16, k+24.
      let byte0 = 0
      let byte1 = 0
      let byte2 = 0
      let byte3 = 0
      let byte4 = 0
      let byte5 = 0
      let byte6 = 0
      let byte7 = 0
      for (let nibbleStart = byteStart; nibbleStart < byteEnd; nibbleStart += NIBBLE_CAPACITY) {
        const nibbleEnd = Math.min(byteEnd, nibbleStart + NIBBLE_CAPACITY)
        let nibble0 = 0
        let nibble1 = 0
        let nibble2 = 0
        let nibble3 = 0
        for (let index = nibbleStart * words + word, end = nibbleEnd * words + word; index < end; index += words) {
          const value = bits[index] as number
          nibble0 = (nibble0 + (value & NIBBLE_ONES)) | 0
          nibble1 = (nibble1 + ((value >>> 1) & NIBBLE_ONES)) | 0
          nibble2 = (nibble2 + ((value >>> 2) & NIBBLE_ONES)) | 0
          nibble3 = (nibble3 + ((value >>> 3) & NIBBLE_ONES)) | 0
        }
        byte0 = (byte0 + (nibble0 & LOW_NIBBLES)) | 0
        byte1 = (byte1 + (nibble1 & LOW_NIBBLES)) | 0
        byte2 = (byte2 + (nibble2 & LOW_NIBBLES)) | 0
        byte3 = (byte3 + (nibble3 & LOW_NIBBLES)) | 0
        byte4 = (byte4 + ((nibble0 >>> 4) & LOW_NIBBLES)) | 0
        byte5 = (byte5 + ((nibble1 >>> 4) & LOW_NIBBLES)) | 0
        byte6 = (byte6 + ((nibble2 >>> 4) & LOW_NIBBLES)) | 0
        byte7 = (byte7 + ((nibble3 >>> 4) & LOW_NIBBLES)) | 0
      }
      for (let shift = 0; shift < 32; shift += 8) {
        const locus = base + shift
        counts[locus] = (counts[locus] as number) + ((byte0 >>> shift) & 255)
        counts[locus + 1] = (counts[locus + 1] as number) + ((byte1 >>> shift) & 255)
        counts[locus + 2] = (counts[locus + 2] as number) + ((byte2 >>> shift) & 255)
        counts[locus + 3] = (counts[locus + 3] as number) + ((byte3 >>> shift) & 255)
        counts[locus + 4] = (counts[locus + 4] as number) + ((byte4 >>> shift) & 255)
        counts[locus + 5] = (counts[locus + 5] as number) + ((byte5 >>> shift) & 255)
        counts[locus + 6] = (counts[locus + 6] as number) + ((byte6 >>> shift) & 255)
        counts[locus + 7] = (counts[locus + 7] as number) + ((byte7 >>> shift) & 255)
      }
    }
  }
  return counts.length === loci ? counts : counts.slice(0, loci)
}
