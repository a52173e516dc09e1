/** Haplotypes added into 4-bit lanes before they are flushed (15 is the largest a nibble holds). */
const NIBBLE_CAPACITY = 15
const NIBBLE_ONES = 0x11111111

/**
 * Number of haplotypes carrying each locus's bit, for every locus of a
 * bitset population (allele counts behind H, q and B).
 *
 * Method: SIMD-within-a-register counting. For each 32-locus word, four
 * accumulators hold eight 4-bit counters each (accumulator k counts bits
 * k, k+4, …, k+28); each haplotype adds (word >>> k) & 0x11111111 to
 * accumulator k — 12 operations per non-zero haplotype-word, haplotypes
 * read in memory order — and the nibbles are flushed into 32-bit counts
 * every 15 haplotypes, before they can overflow.
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
  const lanes = new Int32Array(words * 4)
  // Hot loop: indices are inside the bitset, the lanes and the counts by construction.
  for (let first = 0; first < haplotypes; first += NIBBLE_CAPACITY) {
    const last = Math.min(haplotypes, first + NIBBLE_CAPACITY)
    for (let haplotype = first; haplotype < last; haplotype++) {
      const offset = haplotype * words
      for (let word = 0; word < words; word++) {
        const value = bits[offset + word] as number
        if (value === 0) continue
        const lane = word << 2
        lanes[lane] = (lanes[lane] as number) + (value & NIBBLE_ONES)
        lanes[lane + 1] = (lanes[lane + 1] as number) + ((value >>> 1) & NIBBLE_ONES)
        lanes[lane + 2] = (lanes[lane + 2] as number) + ((value >>> 2) & NIBBLE_ONES)
        lanes[lane + 3] = (lanes[lane + 3] as number) + ((value >>> 3) & NIBBLE_ONES)
      }
    }
    for (let word = 0; word < words; word++) {
      const lane = word << 2
      const lane0 = lanes[lane] as number
      const lane1 = lanes[lane + 1] as number
      const lane2 = lanes[lane + 2] as number
      const lane3 = lanes[lane + 3] as number
      if ((lane0 | lane1 | lane2 | lane3) === 0) continue
      const base = word << 5
      for (let shift = 0; shift < 32; shift += 4) {
        const locus = base + shift
        counts[locus] = (counts[locus] as number) + ((lane0 >>> shift) & 15)
        counts[locus + 1] = (counts[locus + 1] as number) + ((lane1 >>> shift) & 15)
        counts[locus + 2] = (counts[locus + 2] as number) + ((lane2 >>> shift) & 15)
        counts[locus + 3] = (counts[locus + 3] as number) + ((lane3 >>> shift) & 15)
      }
      lanes[lane] = 0
      lanes[lane + 1] = 0
      lanes[lane + 2] = 0
      lanes[lane + 3] = 0
    }
  }
  return counts.length === loci ? counts : counts.slice(0, loci)
}
