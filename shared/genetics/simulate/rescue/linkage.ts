/** Where the loci of one kind sit on the chromosomes. */
export interface LinkageLayout {
  loci: number
  /** chromosomeStart[c] = index of the first locus on chromosome c; entry C = loci. */
  chromosomeStart: Int32Array
  /** Map position of each locus within its chromosome, Morgans. */
  position: Float64Array
}

/**
 * Spreads `loci` loci evenly over `chromosomes` chromosomes of equal length:
 * locus i goes to chromosome ⌊i·C/loci⌋, and the n loci of a chromosome sit
 * at (j + ½)/n of its length. Marker and load loci get separate but
 * interleaved layouts on the same chromosomes.
 *
 * @param loci - number of loci, integer ≥ 0
 * @param chromosomes - C, integer ≥ 1
 * @param chromosomeLength - Morgans, > 0
 * @returns the layout
 * @example linkageLayout(4, 2, 1).position // Float64Array [0.25, 0.75, 0.25, 0.75]
 */
export function linkageLayout(loci: number, chromosomes: number, chromosomeLength: number): LinkageLayout {
  const chromosomeStart = new Int32Array(chromosomes + 1)
  for (let chromosome = 0; chromosome <= chromosomes; chromosome++) {
    chromosomeStart[chromosome] = Math.ceil(chromosome * loci / chromosomes)
  }
  const position = new Float64Array(loci)
  for (let chromosome = 0; chromosome < chromosomes; chromosome++) {
    const first = chromosomeStart[chromosome] ?? 0
    const end = chromosomeStart[chromosome + 1] ?? 0
    const count = end - first
    for (let locus = first; locus < end; locus++) position[locus] = (locus - first + 0.5) / count * chromosomeLength
  }
  return { loci, chromosomeStart, position }
}

/** Sets bits [from, to) of a bitset to 1. */
export function setBitRange(bits: Int32Array, from: number, to: number): void {
  let index = from
  while (index < to && (index & 31) !== 0) {
    bits[index >> 5] = (bits[index >> 5] ?? 0) | (1 << (index & 31))
    index++
  }
  while (index + 32 <= to) {
    bits[index >> 5] = -1
    index += 32
  }
  while (index < to) {
    bits[index >> 5] = (bits[index >> 5] ?? 0) | (1 << (index & 31))
    index++
  }
}

/**
 * Writes, for the loci of one chromosome, which parental haplotype a gamete
 * copies: bit = 1 means "the second haplotype". The gamete starts on
 * `startOnSecond` and switches at every crossover.
 *
 * @param mask - bitset over all loci of this layout; bits of this chromosome must be 0 on entry
 * @param layout - locus positions
 * @param chromosome - chromosome index
 * @param crossovers - crossover positions on this chromosome, ascending, Morgans
 * @param crossoverCount - number of valid entries in `crossovers`
 * @param startOnSecond - whether the gamete starts on the second haplotype
 */
export function writeChromosomeMask(
  mask: Int32Array,
  layout: LinkageLayout,
  chromosome: number,
  crossovers: Float64Array,
  crossoverCount: number,
  startOnSecond: boolean,
): void {
  const end = layout.chromosomeStart[chromosome + 1] ?? 0
  let from = layout.chromosomeStart[chromosome] ?? 0
  let onSecond = startOnSecond
  for (let i = 0; i < crossoverCount; i++) {
    const crossover = crossovers[i] ?? 0
    let to = from
    while (to < end && (layout.position[to] ?? 0) < crossover) to++
    if (onSecond) setBitRange(mask, from, to)
    from = to
    onSecond = !onSecond
  }
  if (onSecond) setBitRange(mask, from, end)
}
