// AssemblyScript source of the allele-count kernel (compiled by scripts/build-kernels.mjs into
// shared/genetics/simulate/kernels/allele-counts-wasm.ts; see allele-counts-kernel.ts there).
//
// `countAlleles` (shared/genetics/simulate/rescue/bit-counts.ts) without bounds checks: for each
// 32-locus word, the haplotypes' words are added into four accumulators of eight 4-bit lanes
// (accumulator k counts bits k, k + 4, …), every 15 haplotypes the nibbles move to eight
// accumulators of four 8-bit lanes, and every 255 haplotypes those are added into the counts.

const NIBBLE_CAPACITY: i32 = 15
const BYTE_CAPACITY: i32 = 17 * NIBBLE_CAPACITY
const NIBBLE_ONES: u32 = 0x11111111
const LOW_NIBBLES: u32 = 0x0f0f0f0f

/** Adds `value`'s byte lanes at `shift` to counts[locus], counts[locus + 1] … (int32 at byte address `counts`). */
// @ts-ignore: decorator
@inline function addLane(counts: usize, locus: usize, value: u32, shift: u32): void {
  const at = counts + (locus << 2)
  store<i32>(at, load<i32>(at) + <i32>((value >>> shift) & 255))
}

/**
 * counts[32·w + b] = number of haplotypes whose word w has bit b set, for `haplotypes` haplotypes
 * of `words` words at byte address `bits`; `counts` (32·words int32) must start at zero.
 */
export function countAlleles(bits: usize, words: i32, haplotypes: i32, counts: usize): void {
  const stride = <usize>words << 2
  for (let word = 0; word < words; word++) {
    const base = <usize>word << 5
    for (let byteStart = 0; byteStart < haplotypes; byteStart += BYTE_CAPACITY) {
      const byteEnd = min(haplotypes, byteStart + BYTE_CAPACITY)
      let byte0: u32 = 0
      let byte1: u32 = 0
      let byte2: u32 = 0
      let byte3: u32 = 0
      let byte4: u32 = 0
      let byte5: u32 = 0
      let byte6: u32 = 0
      let byte7: u32 = 0
      for (let nibbleStart = byteStart; nibbleStart < byteEnd; nibbleStart += NIBBLE_CAPACITY) {
        const nibbleEnd = min(byteEnd, nibbleStart + NIBBLE_CAPACITY)
        let nibble0: u32 = 0
        let nibble1: u32 = 0
        let nibble2: u32 = 0
        let nibble3: u32 = 0
        let at = bits + <usize>nibbleStart * stride + (<usize>word << 2)
        for (let haplotype = nibbleStart; haplotype < nibbleEnd; haplotype++, at += stride) {
          const value = load<u32>(at)
          nibble0 += value & NIBBLE_ONES
          nibble1 += (value >>> 1) & NIBBLE_ONES
          nibble2 += (value >>> 2) & NIBBLE_ONES
          nibble3 += (value >>> 3) & NIBBLE_ONES
        }
        byte0 += nibble0 & LOW_NIBBLES
        byte1 += nibble1 & LOW_NIBBLES
        byte2 += nibble2 & LOW_NIBBLES
        byte3 += nibble3 & LOW_NIBBLES
        byte4 += (nibble0 >>> 4) & LOW_NIBBLES
        byte5 += (nibble1 >>> 4) & LOW_NIBBLES
        byte6 += (nibble2 >>> 4) & LOW_NIBBLES
        byte7 += (nibble3 >>> 4) & LOW_NIBBLES
      }
      for (let shift: u32 = 0; shift < 32; shift += 8) {
        const locus = base + shift
        addLane(counts, locus, byte0, shift)
        addLane(counts, locus + 1, byte1, shift)
        addLane(counts, locus + 2, byte2, shift)
        addLane(counts, locus + 3, byte3, shift)
        addLane(counts, locus + 4, byte4, shift)
        addLane(counts, locus + 5, byte5, shift)
        addLane(counts, locus + 6, byte6, shift)
        addLane(counts, locus + 7, byte7, shift)
      }
    }
  }
}
