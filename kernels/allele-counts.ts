// AssemblyScript source of the allele-count kernel (compiled by scripts/build-kernels.mjs into
// shared/genetics/simulate/kernels/allele-counts-wasm.ts; see allele-counts-kernel.ts there).
//
// `countAlleles` (shared/genetics/simulate/rescue/bit-counts.ts) without bounds checks: for each
// 32-locus word, the haplotypes' words are added into four accumulators of eight 4-bit lanes
// (accumulator k counts bits k, k + 4, …), every 15 haplotypes the nibbles move to eight
// accumulators of four 8-bit lanes, and every 255 haplotypes those are added into the counts.
// Four words go side by side in the lanes of 128-bit SIMD vectors; leftover words one at a time.
// Counts are integers, so the order of the additions does not matter.

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

/** Adds the eight byte accumulators of one word (bits k, k + 4, … in accumulator k, bits k + 4 … in the high nibbles' accumulator k + 4) to its 32 counts. */
// @ts-ignore: decorator
@inline function addWordCounts(counts: usize, base: usize, byte0: u32, byte1: u32, byte2: u32, byte3: u32, byte4: u32, byte5: u32, byte6: u32, byte7: u32): void {
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

/**
 * counts[32·w + b] = number of haplotypes whose word w has bit b set, for `haplotypes` haplotypes
 * of `words` words at byte address `bits`; `counts` (32·words int32) must start at zero.
 */
export function countAlleles(bits: usize, words: i32, haplotypes: i32, counts: usize): void {
  let word = 0
  for (; word + 3 < words; word += 4) countFourWords(bits, words, haplotypes, counts, word)
  for (; word < words; word++) countWord(bits, words, haplotypes, counts, word)
}

/** `countAlleles` for words word … word + 3, one per 32-bit lane. */
function countFourWords(bits: usize, words: i32, haplotypes: i32, counts: usize, word: i32): void {
  const stride = <usize>words << 2
  const nibbleOnes = i32x4.splat(<i32>NIBBLE_ONES)
  const lowNibbles = i32x4.splat(<i32>LOW_NIBBLES)
  for (let byteStart = 0; byteStart < haplotypes; byteStart += BYTE_CAPACITY) {
    const byteEnd = min(haplotypes, byteStart + BYTE_CAPACITY)
    let byte0 = i32x4.splat(0)
    let byte1 = i32x4.splat(0)
    let byte2 = i32x4.splat(0)
    let byte3 = i32x4.splat(0)
    let byte4 = i32x4.splat(0)
    let byte5 = i32x4.splat(0)
    let byte6 = i32x4.splat(0)
    let byte7 = i32x4.splat(0)
    for (let nibbleStart = byteStart; nibbleStart < byteEnd; nibbleStart += NIBBLE_CAPACITY) {
      const nibbleEnd = min(byteEnd, nibbleStart + NIBBLE_CAPACITY)
      let nibble0 = i32x4.splat(0)
      let nibble1 = i32x4.splat(0)
      let nibble2 = i32x4.splat(0)
      let nibble3 = i32x4.splat(0)
      let at = bits + <usize>nibbleStart * stride + (<usize>word << 2)
      for (let haplotype = nibbleStart; haplotype < nibbleEnd; haplotype++, at += stride) {
        const value = v128.load(at)
        nibble0 = i32x4.add(nibble0, v128.and(value, nibbleOnes))
        nibble1 = i32x4.add(nibble1, v128.and(i32x4.shr_u(value, 1), nibbleOnes))
        nibble2 = i32x4.add(nibble2, v128.and(i32x4.shr_u(value, 2), nibbleOnes))
        nibble3 = i32x4.add(nibble3, v128.and(i32x4.shr_u(value, 3), nibbleOnes))
      }
      byte0 = i32x4.add(byte0, v128.and(nibble0, lowNibbles))
      byte1 = i32x4.add(byte1, v128.and(nibble1, lowNibbles))
      byte2 = i32x4.add(byte2, v128.and(nibble2, lowNibbles))
      byte3 = i32x4.add(byte3, v128.and(nibble3, lowNibbles))
      byte4 = i32x4.add(byte4, v128.and(i32x4.shr_u(nibble0, 4), lowNibbles))
      byte5 = i32x4.add(byte5, v128.and(i32x4.shr_u(nibble1, 4), lowNibbles))
      byte6 = i32x4.add(byte6, v128.and(i32x4.shr_u(nibble2, 4), lowNibbles))
      byte7 = i32x4.add(byte7, v128.and(i32x4.shr_u(nibble3, 4), lowNibbles))
    }
    const base = <usize>word << 5
    addWordCounts(counts, base, <u32>i32x4.extract_lane(byte0, 0), <u32>i32x4.extract_lane(byte1, 0), <u32>i32x4.extract_lane(byte2, 0), <u32>i32x4.extract_lane(byte3, 0),
      <u32>i32x4.extract_lane(byte4, 0), <u32>i32x4.extract_lane(byte5, 0), <u32>i32x4.extract_lane(byte6, 0), <u32>i32x4.extract_lane(byte7, 0))
    addWordCounts(counts, base + 32, <u32>i32x4.extract_lane(byte0, 1), <u32>i32x4.extract_lane(byte1, 1), <u32>i32x4.extract_lane(byte2, 1), <u32>i32x4.extract_lane(byte3, 1),
      <u32>i32x4.extract_lane(byte4, 1), <u32>i32x4.extract_lane(byte5, 1), <u32>i32x4.extract_lane(byte6, 1), <u32>i32x4.extract_lane(byte7, 1))
    addWordCounts(counts, base + 64, <u32>i32x4.extract_lane(byte0, 2), <u32>i32x4.extract_lane(byte1, 2), <u32>i32x4.extract_lane(byte2, 2), <u32>i32x4.extract_lane(byte3, 2),
      <u32>i32x4.extract_lane(byte4, 2), <u32>i32x4.extract_lane(byte5, 2), <u32>i32x4.extract_lane(byte6, 2), <u32>i32x4.extract_lane(byte7, 2))
    addWordCounts(counts, base + 96, <u32>i32x4.extract_lane(byte0, 3), <u32>i32x4.extract_lane(byte1, 3), <u32>i32x4.extract_lane(byte2, 3), <u32>i32x4.extract_lane(byte3, 3),
      <u32>i32x4.extract_lane(byte4, 3), <u32>i32x4.extract_lane(byte5, 3), <u32>i32x4.extract_lane(byte6, 3), <u32>i32x4.extract_lane(byte7, 3))
  }
}

/** `countAlleles` for one word. */
function countWord(bits: usize, words: i32, haplotypes: i32, counts: usize, word: i32): void {
  const stride = <usize>words << 2
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
    addWordCounts(counts, base, byte0, byte1, byte2, byte3, byte4, byte5, byte6, byte7)
  }
}
