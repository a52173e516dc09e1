// AssemblyScript source of the genome kernel (compiled by scripts/build-kernels.mjs into
// shared/genetics/simulate/kernels/genome-wasm.ts; see that folder's genome-kernel.ts).
//
// It writes gametes of the individual-based rescue model under free recombination: for each
// 32-locus word of a parent's two haplotypes, the word where they agree is copied and, where
// they differ, one random word from the phase's xoroshiro128+ stream picks, bit by bit, which
// haplotype each locus comes from — exactly `writeGamete`'s loops in
// shared/genetics/simulate/rescue/gamete.ts, drawing the same numbers in the same order
// (pure-rand's algorithm on two 64-bit words), so using it never changes a result
// (tests/unit/genetics/genome-kernel.test.ts).
//
// Memory layout (bytes), shared with genome-kernel.ts:
//   0–15   generator state: s0 and s1 as little-endian 64-bit words (see WordStream)
//   16…    haplotype arrays placed by the caller

/**
 * One haplotype of a gamete: out[w] = a[w] where a[w] = b[w], else a[w] ^ ((a[w] ^ b[w]) & r)
 * with r the stream's next 32-bit output, for w = 0 … words − 1 (a, b, out: byte addresses).
 */
function gameteWords(first: usize, second: usize, out: usize, words: i32): void {
  let state0 = load<i64>(0)
  let state1 = load<i64>(8)
  for (let word: usize = 0; word < <usize>words; word++) {
    const a = load<i32>(first + (word << 2))
    const difference = a ^ load<i32>(second + (word << 2))
    if (difference == 0) {
      store<i32>(out + (word << 2), a)
    } else {
      // pure-rand's xoroshiro128+ next(): low 32 bits of s0 + s1, then the a = 24, b = 16, c = 37 step.
      const random = <i32>(state0 + state1)
      const mixed = state1 ^ state0
      state0 = rotl<i64>(state0, 24) ^ mixed ^ (mixed << 16)
      state1 = rotl<i64>(mixed, 37)
      store<i32>(out + (word << 2), a ^ (difference & random))
    }
  }
  store<i64>(0, state0)
  store<i64>(8, state1)
}

/**
 * The marker and load words of one gamete: `gameteWords` for the markers (the parent's two
 * haplotypes at markerFirst and markerFirst + 4·markerWords, written to markerOut), then for the
 * load loci likewise — one call per gamete instead of two.
 */
export function gamete(markerFirst: usize, markerOut: usize, markerWords: i32, loadFirst: usize, loadOut: usize, loadWords: i32): void {
  gameteWords(markerFirst, markerFirst + (<usize>markerWords << 2), markerOut, markerWords)
  gameteWords(loadFirst, loadFirst + (<usize>loadWords << 2), loadOut, loadWords)
}
