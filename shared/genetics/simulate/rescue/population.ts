import type { GenomeArchitecture } from './architecture'

/**
 * One generation of diploid adults in compact typed arrays.
 *
 * Haplotype h (0 or 1) of individual i starts at word (2i + h)·words of the
 * marker and load bitsets; bit j of a haplotype is locus j (1 = the derived
 * marker allele, or the harmful allele at a load locus).
 */
export interface Population {
  size: number
  /** 1 for males, 0 for females. */
  male: Uint8Array
  /** Marker bitsets, size × 2 × markerWords. */
  markers: Int32Array
  /** Load bitsets, size × 2 × loadWords. */
  load: Int32Array
  /** Adaptive-locus alleles (1 = A), size × 2. */
  adaptive: Uint8Array
  /** Pedigree kinship matrix (size × size, row-major) relative to the founders of the phase; null when not tracked. */
  kinship: Float32Array | null
}

/**
 * Allocates a population of `size` individuals with all bits 0; the first
 * ⌈size/2⌉ are female and the rest male (equal sex ratio, the assumption of
 * the Ne formulas).
 *
 * @param size - individuals, integer ≥ 0
 * @param architecture - genome layout
 * @param withKinship - whether to allocate a kinship matrix
 * @returns a new population
 */
export function allocatePopulation(size: number, architecture: GenomeArchitecture, withKinship: boolean): Population {
  const male = new Uint8Array(size)
  male.fill(1, Math.ceil(size / 2))
  return {
    size,
    male,
    markers: new Int32Array(size * 2 * architecture.markerWords),
    load: new Int32Array(size * 2 * architecture.loadWords),
    adaptive: new Uint8Array(size * 2),
    kinship: withKinship ? new Float32Array(size * size) : null,
  }
}

/**
 * Kinship matrix of unrelated, non-inbred founders: ½ on the diagonal
 * (self-kinship ½(1 + F) with F = 0), 0 elsewhere.
 *
 * @param size - individuals
 * @returns a new size × size matrix
 * @example founderKinship(2) // Float32Array [0.5, 0, 0, 0.5]
 */
export function founderKinship(size: number): Float32Array {
  const kinship = new Float32Array(size * size)
  for (let i = 0; i < size; i++) kinship[i * size + i] = 0.5
  return kinship
}
