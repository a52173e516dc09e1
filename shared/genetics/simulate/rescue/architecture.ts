import { sampleGamma } from '../random/gamma'
import type { RandomStream } from '../random/streams'
import { dominanceFromSelection, dominanceRate } from './dominance'
import { linkageLayout } from './linkage'
import type { LinkageLayout } from './linkage'
import type { RescuePlan } from './rescue-plan'

/** Genome shared by every individual and replicate of a run. */
export interface GenomeArchitecture {
  markerLoci: number
  /** 32-bit words per marker haplotype. */
  markerWords: number
  loadLoci: number
  /** 32-bit words per load haplotype (0 without load). */
  loadWords: number
  /** s of each load locus (homozygote fitness 1 − s), in (0, 1]. */
  selection: Float64Array
  /** h of each load locus (heterozygote fitness 1 − h·s). */
  dominance: Float64Array
  /** ln(1 − s) per load locus (−Infinity for lethals). */
  logHomozygous: Float64Array
  /** ln(1 − h·s) per load locus. */
  logHeterozygous: Float64Array
  /**
   * Per byte of the load bitset (8 loci), the sum of ln(1 − s) over the
   * loci set in each of the 256 byte values: entry byte·256 + value.
   */
  byteLogHomozygous: Float64Array
  /** The same for ln(1 − h·s) (heterozygous loci). */
  byteLogHeterozygous: Float64Array
  /** Starting frequency of the harmful allele at each load locus (large ancestral population). */
  ancestralLoadFrequency: Float64Array
  /** U, new harmful mutations per gamete per generation. */
  mutationRate: number
  /** Chromosome layout of markers and load loci; null = free recombination. */
  markerLayout: LinkageLayout | null
  loadLayout: LinkageLayout | null
  chromosomes: number
  chromosomeLength: number
}

/** Words of 32 bits needed for `bits` bits. */
export function wordsFor(bits: number): number {
  return Math.ceil(bits / 32)
}

/**
 * Deterministic mutation–selection balance of a harmful allele in a large
 * random-mating population, the starting frequency of each load locus:
 * the positive root of u = q·s·[h + (1 − 2h)·q] (the equilibrium of
 * SCIENCE.md eq. 2.1's selection step against mutation at rate u, dropping
 * q² terms of the mutation input), i.e. q̂ ≈ u/(h·s) for h > 0 and √(u/s)
 * for h = 0 (Haldane 1927; Crow & Kimura 1970 [memory]). Capped at ½:
 * near-neutral loci would otherwise get meaningless values.
 *
 * @param mutationRate - u per gene per generation, ≥ 0
 * @param selection - s in (0, 1]
 * @param dominance - h in [0, ½]
 * @returns q̂ in [0, ½]
 * @example equilibriumFrequency(1e-4, 0.1, 0.5) // 0.002
 * @example equilibriumFrequency(1e-4, 1, 0)     // 0.01
 */
export function equilibriumFrequency(mutationRate: number, selection: number, dominance: number): number {
  const quadratic = (1 - 2 * dominance) * selection
  const linear = dominance * selection
  if (mutationRate === 0) return 0
  const root = quadratic < 1e-12 * linear
    ? mutationRate / linear
    : (-linear + Math.sqrt(linear * linear + 4 * quadratic * mutationRate)) / (2 * quadratic)
  return Math.min(0.5, root)
}

/**
 * Draws the load loci's selection and dominance coefficients (once per run,
 * from the seed's shared stream, so every replicate and worker sees the same
 * genome) and lays out the linkage map.
 *
 * s ~ Gamma(shape β, mean s̄) capped at 1 (lethal); h = exp(−k·s)/2.
 *
 * @param plan - validated inputs
 * @param random - the run's shared stream
 * @returns the genome architecture
 */
export function genomeArchitecture(plan: RescuePlan, random: RandomStream): GenomeArchitecture {
  const loadLoci = plan.load?.loci ?? 0
  const selection = new Float64Array(loadLoci)
  const dominance = new Float64Array(loadLoci)
  const logHomozygous = new Float64Array(loadLoci)
  const logHeterozygous = new Float64Array(loadLoci)
  const ancestralLoadFrequency = new Float64Array(loadLoci)
  const load = plan.load
  if (load) {
    const rate = dominanceRate(load.meanDominance, load.meanSelection, load.selectionShape)
    const perLocusMutation = load.mutationRate / load.loci
    for (let locus = 0; locus < loadLoci; locus++) {
      // A gamma draw can underflow to 0 for tiny shapes; keep s strictly positive.
      const s = Math.min(1, Math.max(Number.MIN_VALUE, sampleGamma(random, load.selectionShape, load.meanSelection / load.selectionShape)))
      const h = dominanceFromSelection(s, rate)
      selection[locus] = s
      dominance[locus] = h
      logHomozygous[locus] = Math.log1p(-s)
      logHeterozygous[locus] = Math.log1p(-h * s)
      ancestralLoadFrequency[locus] = equilibriumFrequency(perLocusMutation, s, h)
    }
  }
  const map = plan.map
  return {
    byteLogHomozygous: byteSums(logHomozygous),
    byteLogHeterozygous: byteSums(logHeterozygous),
    markerLoci: plan.markerLoci,
    markerWords: wordsFor(plan.markerLoci),
    loadLoci,
    loadWords: wordsFor(loadLoci),
    selection,
    dominance,
    logHomozygous,
    logHeterozygous,
    ancestralLoadFrequency,
    mutationRate: load?.mutationRate ?? 0,
    markerLayout: map ? linkageLayout(plan.markerLoci, map.chromosomes, map.chromosomeLength) : null,
    loadLayout: map && loadLoci > 0 ? linkageLayout(loadLoci, map.chromosomes, map.chromosomeLength) : null,
    chromosomes: map?.chromosomes ?? 0,
    chromosomeLength: map?.chromosomeLength ?? 0,
  }
}

/**
 * Lookup table of sums over the set bits of each byte value: entry
 * byte·256 + value = Σ_(bit i set in value) perLocus[8·byte + i]. Turns a
 * per-allele loop into four lookups per 32-locus word.
 *
 * @param perLocus - one value per locus (loci beyond its length count as 0)
 * @returns a new table of ⌈loci/8⌉·256 entries (−Infinity where a lethal is included)
 * @example byteSums(Float64Array.of(1, 2)).subarray(0, 4) // Float64Array [0, 1, 2, 3]
 */
export function byteSums(perLocus: Float64Array): Float64Array {
  const bytes = Math.ceil(perLocus.length / 32) * 4
  const table = new Float64Array(bytes * 256)
  for (let byte = 0; byte < bytes; byte++) {
    for (let value = 1; value < 256; value++) {
      const low = value & -value
      const bit = 31 - Math.clz32(low)
      table[byte * 256 + value] = (table[byte * 256 + (value ^ low)] ?? 0) + (perLocus[8 * byte + bit] ?? 0)
    }
  }
  return table
}
