import type { RandomStream } from '../random/streams'
import type { GenomeArchitecture } from './architecture'
import { evaluateFitness } from './evaluate'
import { foundingPopulation } from './founders'
import { gameteScratch } from './gamete'
import type { Population } from './population'
import { reproduce, reproductionScratch } from './reproduce'
import type { PopulationPlan } from './rescue-plan'

/**
 * A population brought to mutation–selection–drift balance for its own size
 * history: founders from the large ancestral population
 * (`foundingPopulation`, burnInCensus[0] individuals), then
 * `burnInGenerations` generations of mutation, selection (load only; the
 * adaptive locus is assigned at the start of the phase) and drift at the
 * burn-in census and target Ne/N; the last burn-in generation produces the
 * phase's first census. Pedigrees are not tracked during the burn-in.
 *
 * The default length min(4N, 200) generations is a speed compromise: harmful
 * alleles with h·s ≥ 0.005 re-equilibrate from the ancestral balance within
 * about 1/(h·s) ≤ 200 generations and drift fixes alleles on a time scale of
 * ~N generations, so small recipients (N ≤ 50) get their full 4N; for larger
 * populations, or a known longer isolation, set `burnInGenerations` to the
 * history (e.g. 4N) — nearly neutral alleles may otherwise still carry the
 * ancestral frequencies.
 *
 * @param plan - the population's size history
 * @param architecture - genome
 * @param random - the population's burn-in stream
 * @returns the population at phase generation 0, or null if it went extinct
 */
export function burnIn(plan: PopulationPlan, architecture: GenomeArchitecture, random: RandomStream): Population | null {
  const { burnInCensus, burnInGenerations, census, effectiveRatio } = plan
  const phaseStart = census[0] ?? 2
  let population = foundingPopulation(burnInGenerations > 0 ? burnInCensus[0] ?? phaseStart : phaseStart, architecture, random)
  const scratch = reproductionScratch(gameteScratch(architecture))
  for (let generation = 0; generation < burnInGenerations; generation++) {
    const nextSize = generation + 1 < burnInGenerations ? burnInCensus[generation + 1] ?? phaseStart : phaseStart
    const fitness = evaluateFitness(population, architecture, null)
    const next = reproduce(population, fitness, nextSize, effectiveRatio, architecture, null, random, scratch)
    if (!next) return null
    population = next
  }
  return population
}
