import type { GenomeArchitecture } from './architecture'
import type { Pedigree } from './pedigree'

/**
 * One generation of diploid adults in compact typed arrays.
 *
 * Haplotype h (0 or 1) of individual i starts at word (2i + h)·words of the
 * marker and load bitsets; bit j of a haplotype is locus j (1 = the derived
 * marker allele, or the harmful allele at a load locus).
 *
 * The haplotype arrays of a population made by `reproduce` may be views of
 * its lineage's genome kernel memory, which that lineage reuses for the
 * generation after next (see `GenomeKernel`).
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
  /** Parents and their kinship, for pedigree F relative to the founders of the phase; null when not tracked. */
  pedigree: Pedigree | null
}

/**
 * Allocates a population of `size` individuals with all bits 0; the first
 * ⌈size/2⌉ are female and the rest male (equal sex ratio, the assumption of
 * the Ne formulas).
 *
 * @param size - individuals, integer ≥ 0
 * @param architecture - genome layout
 * @returns a new population without a pedigree
 */
export function allocatePopulation(size: number, architecture: GenomeArchitecture): Population {
  return {
    size,
    male: sexesOf(size),
    markers: new Int32Array(size * 2 * architecture.markerWords),
    load: new Int32Array(size * 2 * architecture.loadWords),
    adaptive: new Uint8Array(size * 2),
    pedigree: null,
  }
}

/**
 * The sexes of a generation of `size`: the first ⌈size/2⌉ female (0), the rest male (1).
 *
 * @param size - individuals, integer ≥ 0
 * @returns a new array, 1 for males
 */
export function sexesOf(size: number): Uint8Array {
  const male = new Uint8Array(size)
  male.fill(1, Math.ceil(size / 2))
  return male
}
