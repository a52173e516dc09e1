// AssemblyScript source of the fitness kernel (compiled by scripts/build-kernels.mjs into
// shared/genetics/simulate/kernels/fitness-wasm.ts; see that folder's fitness-kernel.ts).
//
// It sums each individual's log fitness over the load loci from byte tables, exactly as the
// loop `evaluateFitness` (shared/genetics/simulate/rescue/evaluate.ts) describes: word by word
// across all individuals, each individual adding its words in order, the four homozygous then
// the four heterozygous byte lookups of a word added left to right — the same IEEE additions
// in the same order, so the same doubles (tests/unit/genetics/rescue-kernels.test.ts).

/**
 * out[i] = Σ_w (hom[w][bytes of a&b] summed left to right) + (het[w][bytes of a^b] …) for each
 * individual i < size, where a, b are word w of its two load haplotypes (haplotypes of
 * individual i at haplotypes + 4·2i·words and haplotypes + 4·(2i + 1)·words; tables: 1024 doubles per word,
 * four 256-entry byte tables; all arguments byte addresses).
 */
export function logFitness(haplotypes: usize, size: i32, words: i32, hom: usize, het: usize, out: usize): void {
  for (let individual: usize = 0; individual < <usize>size; individual++) store<f64>(out + (individual << 3), 0)
  const stride = <usize>words << 3 // bytes from one individual's first haplotype to the next's
  const second = <usize>words << 2
  for (let word: usize = 0; word < <usize>words; word++) {
    const homTable = hom + (word << 13)
    const hetTable = het + (word << 13)
    let first = haplotypes + (word << 2)
    for (let individual: usize = 0; individual < <usize>size; individual++, first += stride) {
      const a = load<u32>(first)
      const b = load<u32>(first + second)
      const homozygous = a & b
      const heterozygous = a ^ b
      let sum = load<f64>(out + (individual << 3))
      sum += load<f64>(homTable + ((homozygous & 255) << 3)) + load<f64>(homTable + 2048 + (((homozygous >>> 8) & 255) << 3))
        + load<f64>(homTable + 4096 + (((homozygous >>> 16) & 255) << 3)) + load<f64>(homTable + 6144 + ((homozygous >>> 24) << 3))
      sum += load<f64>(hetTable + ((heterozygous & 255) << 3)) + load<f64>(hetTable + 2048 + (((heterozygous >>> 8) & 255) << 3))
        + load<f64>(hetTable + 4096 + (((heterozygous >>> 16) & 255) << 3)) + load<f64>(hetTable + 6144 + ((heterozygous >>> 24) << 3))
      store<f64>(out + (individual << 3), sum)
    }
  }
}
