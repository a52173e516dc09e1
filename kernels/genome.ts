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
//   16…    two population slots, then scratch, placed by the caller (GenomeKernel)
//
// It also runs whole generations without immigrants and places founders' harmful copies (below).

/** The stream's two state words while a kernel function runs (copied in from and out to bytes 0–15). */
let streamState0: i64 = 0
let streamState1: i64 = 0

/**
 * The marker and load words of one gamete: `gameteWords` for the markers (the parent's two
 * haplotypes at markerFirst and markerFirst + 4·markerWords, written to markerOut), then for the
 * load loci likewise — one call per gamete instead of two.
 */
export function gamete(markerFirst: usize, markerOut: usize, markerWords: i32, loadFirst: usize, loadOut: usize, loadWords: i32): void {
  streamState0 = load<i64>(0)
  streamState1 = load<i64>(8)
  gameteWords(markerFirst, markerFirst + (<usize>markerWords << 2), markerOut, markerWords)
  gameteWords(loadFirst, loadFirst + (<usize>loadWords << 2), loadOut, loadWords)
  store<i64>(0, streamState0)
  store<i64>(8, streamState1)
}

// ---------------------------------------------------------------------------------------------
// A whole generation (no immigrants): `reproduce`'s loop over offspring and parental slots
// (shared/genetics/simulate/rescue/reproduce.ts) with the TypeScript helpers it calls there —
// `uniform01` (random/uniform.ts), `WeightedSampler.sample` (random/weighted-sampler.ts),
// `writeGamete` and `finishGamete` (rescue/gamete.ts) and `samplePoisson` below its
// multiplication limit (random/poisson.ts) — the same IEEE operations on the same draws in the
// same order, so the offspring, the parent numbers and the stream's end state are those of the
// TypeScript (tests/unit/genetics/genome-kernel.test.ts).

/** pure-rand's xoroshiro128+ next() on the global state (the step `gameteWords` inlines). */
// @ts-ignore: decorator
@inline function nextWord(): i32 {
  const s0 = streamState0
  const s1 = streamState1
  const out = <i32>(s0 + s1)
  const mixed = s1 ^ s0
  streamState0 = rotl<i64>(s0, 24) ^ mixed ^ (mixed << 16)
  streamState1 = rotl<i64>(mixed, 37)
  return out
}

/** uniform01: (high 26 bits · 2²⁷ + low 27 bits) · 2⁻⁵³ from two draws, high first. */
// @ts-ignore: decorator
@inline function uniform01(): f64 {
  const high = <u32>nextWord() >>> 6
  const low = <u32>nextWord() >>> 5
  return (<f64>high * 134217728.0 + <f64>low) * (1.0 / 9007199254740992.0)
}

/** `WeightedSampler.sample` on the alias tables at `threshold` (f64) and `alias` (i32) of `size` columns. */
// @ts-ignore: decorator
@inline function sampleColumn(threshold: usize, alias: usize, size: i32): i32 {
  const position = uniform01() * <f64>size
  const column = Math.floor(position)
  const index = <i32>column
  return position - column < load<f64>(threshold + (<usize>index << 3)) ? index : load<i32>(alias + (<usize>index << 2))
}

/**
 * One haplotype of a gamete: out[w] = a[w] where a[w] = b[w], else a[w] ^ ((a[w] ^ b[w]) & r)
 * with r the stream's next 32-bit output, for w = 0 … words − 1 (a, b, out: byte addresses).
 */
function gameteWords(first: usize, second: usize, out: usize, words: i32): void {
  let state0 = streamState0
  let state1 = streamState1
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
  streamState0 = state0
  streamState1 = state1
}

/**
 * Writes `count` offspring from the parents. All addresses are bytes; the parents' and
 * offspring's marker and load haplotypes (int32 words) and adaptive alleles (one byte per
 * haplotype) are laid out as in `Population`. Mothers come from the female sampler (alias
 * tables `femaleThreshold`, `femaleAlias` over `femaleSize` columns; column c is parent
 * `femaleIndices[c]`), fathers likewise from the male sampler; each offspring's mother and father
 * go to `mothers` and `fathers`. After each gamete's words, Poisson(U) new harmful mutations at
 * uniform load loci when `mutate` ≠ 0 (`mutationLimit` = e^−U, U below the multiplication limit),
 * then the adaptive allele of a random parental haplotype.
 */
export function offspringGeneration(
  count: i32,
  femaleIndices: usize, femaleThreshold: usize, femaleAlias: usize, femaleSize: i32,
  maleIndices: usize, maleThreshold: usize, maleAlias: usize, maleSize: i32,
  parentMarkers: usize, parentLoad: usize, parentAdaptive: usize,
  childMarkers: usize, childLoad: usize, childAdaptive: usize,
  markerWords: i32, loadWords: i32,
  mutate: i32, mutationLimit: f64, loadLoci: i32,
  mothers: usize, fathers: usize,
): void {
  streamState0 = load<i64>(0)
  streamState1 = load<i64>(8)
  const markerBytes = <usize>markerWords << 2
  const loadBytes = <usize>loadWords << 2
  for (let child: i32 = 0; child < count; child++) {
    for (let slot: i32 = 0; slot < 2; slot++) {
      let parent: i32
      if (slot == 0) {
        parent = load<i32>(femaleIndices + (<usize>sampleColumn(femaleThreshold, femaleAlias, femaleSize) << 2))
        store<i32>(mothers + (<usize>child << 2), parent)
      } else {
        parent = load<i32>(maleIndices + (<usize>sampleColumn(maleThreshold, maleAlias, maleSize) << 2))
        store<i32>(fathers + (<usize>child << 2), parent)
      }
      const haplotype = <usize>(2 * child + slot)
      const markerFirst = parentMarkers + <usize>(2 * parent) * markerBytes
      gameteWords(markerFirst, markerFirst + markerBytes, childMarkers + haplotype * markerBytes, markerWords)
      const loadFirst = parentLoad + <usize>(2 * parent) * loadBytes
      const loadOut = childLoad + haplotype * loadBytes
      gameteWords(loadFirst, loadFirst + loadBytes, loadOut, loadWords)
      if (mutate != 0) {
        let mutations: i32 = 0
        let product = uniform01()
        while (product > mutationLimit) {
          mutations++
          product *= uniform01()
        }
        for (let mutation: i32 = 0; mutation < mutations; mutation++) {
          const locus = <i32>Math.floor(uniform01() * <f64>loadLoci)
          const word = loadOut + (<usize>(locus >> 5) << 2)
          store<i32>(word, load<i32>(word) | (1 << (locus & 31)))
        }
      }
      store<u8>(childAdaptive + haplotype, load<u8>(parentAdaptive + <usize>(2 * parent) + <usize>(nextWord() & 1)))
    }
  }
  store<i64>(0, streamState0)
  store<i64>(8, streamState1)
}

/**
 * The founders' harmful copies at one load locus (`foundingPopulation`,
 * shared/genetics/simulate/rescue/founders.ts): `copies` times, a haplotype uniform among
 * `haplotypes` (`uniformIndex`: ⌊uniform01 · haplotypes⌋) gets bit `bit` of its word `word`
 * (haplotypes of `loadWords` int32 words at byte address `haplotypeWords`). The stream's state is read from
 * and written back to bytes 0–15, where the TypeScript draws between calls also find it.
 */
export function placeCopies(haplotypeWords: usize, loadWords: i32, haplotypes: i32, word: i32, bit: i32, copies: i32): void {
  streamState0 = load<i64>(0)
  streamState1 = load<i64>(8)
  for (let copy: i32 = 0; copy < copies; copy++) {
    const haplotype = <i32>Math.floor(uniform01() * <f64>haplotypes)
    const at = haplotypeWords + ((<usize>haplotype * <usize>loadWords + <usize>word) << 2)
    store<i32>(at, load<i32>(at) | bit)
  }
  store<i64>(0, streamState0)
  store<i64>(8, streamState1)
}
