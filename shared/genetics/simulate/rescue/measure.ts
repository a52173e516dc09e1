import type { GenomeArchitecture } from './architecture'
import { countAlleles } from './bit-counts'
import { meanPedigreeInbreeding } from './pedigree'
import type { Population } from './population'

/** Quantities recorded for one generation of one population. */
export interface GenerationMeasures {
  census: number
  /** Mean over marker loci of 2p(1 − p), p the allele frequency among the 2N genes. */
  heterozygosity: number
  /** Mean pedigree inbreeding F of the individuals (NaN without a pedigree). */
  pedigreeInbreeding: number
  /** Mean absolute fitness. */
  meanFitness: number
  /** B, haploid lethal equivalents: Σ_l q_l(1 − q_l)·s_l·(1 − 2h_l). */
  inbreedingLoad: number
  /** 1 − Π over fixed load loci of (1 − s_l). */
  driftLoad: number
  /** Load loci fixed for the harmful allele. */
  fixedHarmful: number
  /** Frequency of the adaptive allele A. */
  adaptiveFrequency: number
}

/**
 * Measures a population (SCIENCE.md §4 for H and F, §6 for the loads).
 *
 * Inbreeding load: the lethal equivalents per gamete, B = −d ln W/dF at
 * F = 0 for a population with harmful-allele frequencies q_l under
 * multiplicative fitness, to first order in s: B = Σ q(1 − q)·s(1 − 2h)
 * (Morton, Crow & Muller 1956; the form used by e.g. Hedrick & García-Dorado
 * 2016, TREE 31:940–952 [memory]) — the part of the load that inbreeding
 * would express and that gene flow keeps hidden. Drift load: the fitness
 * lost to harmful alleles fixed in the population, 1 − Π_fixed(1 − s)
 * (e.g. Whitlock, Ingvarsson & Hatfield 2000 [memory]); every individual
 * carries it, so only gene flow from a population without those alleles
 * can remove it.
 *
 * @param population - individuals of this generation
 * @param fitness - their fitness (from `evaluateFitness`)
 * @param architecture - genome layout, s and h per load locus
 * @returns the measures
 */
export function measureGeneration(population: Population, fitness: Float64Array, architecture: GenomeArchitecture): GenerationMeasures {
  const { size } = population
  const genes = 2 * size
  const heterozygosity = markerHeterozygosity(population, architecture)

  let inbreedingLoad = 0
  let fixedHarmful = 0
  let fixedLogFitness = 0
  if (architecture.loadLoci > 0) {
    const loadCounts = countAlleles(population.load, architecture.loadWords, genes, architecture.loadLoci)
    for (let locus = 0; locus < loadCounts.length; locus++) {
      const count = loadCounts[locus] ?? 0
      if (count === 0) continue
      if (count === genes) {
        fixedHarmful++
        fixedLogFitness += architecture.logHomozygous[locus] ?? 0
        continue
      }
      const q = count / genes
      inbreedingLoad += q * (1 - q) * (architecture.selection[locus] ?? 0) * (1 - 2 * (architecture.dominance[locus] ?? 0))
    }
  }

  const pedigreeInbreeding = population.pedigree ? meanPedigreeInbreeding(population.pedigree) : Number.NaN
  let fitnessSum = 0
  for (const value of fitness) fitnessSum += value
  let adaptiveCopies = 0
  for (const allele of population.adaptive) adaptiveCopies += allele
  return {
    census: size,
    heterozygosity,
    pedigreeInbreeding,
    meanFitness: fitnessSum / size,
    inbreedingLoad,
    driftLoad: -Math.expm1(fixedLogFitness),
    fixedHarmful,
    adaptiveFrequency: adaptiveCopies / genes,
  }
}

/**
 * Mean over marker loci of 2p(1 − p), p the frequency of the derived allele
 * among the population's 2N genes (the gene-pool heterozygosity whose
 * expectation decays as (1 − 1/(2Ne))ᵗ, SCIENCE.md eq. 4.1).
 *
 * @param population - individuals
 * @param architecture - marker layout
 * @returns H in [0, ½]
 */
export function markerHeterozygosity(population: Population, architecture: GenomeArchitecture): number {
  const genes = 2 * population.size
  const counts = countAlleles(population.markers, architecture.markerWords, genes, architecture.markerLoci)
  let sum = 0
  for (const count of counts) {
    const p = count / genes
    sum += 2 * p * (1 - p)
  }
  return sum / architecture.markerLoci
}
