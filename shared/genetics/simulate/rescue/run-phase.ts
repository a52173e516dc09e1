import type { RandomStream } from '../random/streams'
import type { GenomeArchitecture } from './architecture'
import { evaluateFitness } from './evaluate'
import type { AdaptiveSelection } from './evaluate'
import { gameteScratch } from './gamete'
import { markerHeterozygosity, measureGeneration } from './measure'
import type { GenerationMeasures } from './measure'
import type { Population } from './population'
import { reproduce, reproductionScratch } from './reproduce'
import type { ReproductionScratch } from './reproduce'
import type { RescuePlan } from './rescue-plan'
import { withMigrants } from './translocate'
import { RESCUE_METRICS } from './types'
import type { RescueMetric } from './types'

/** Per-generation record of one arm: metric → values for generations 0…G (NaN after extinction). */
export type ArmRecord = Record<RescueMetric, Float64Array>

/**
 * The translocation phase for one arm of a replicate.
 *
 * Each generation t: (with translocation) the event's migrants join the
 * recipient; fitness is evaluated and the generation is measured (the record
 * for generation t); the recipient reproduces (with immigrant parents under
 * continuing migration); then (with translocation) the source reproduces on
 * its own schedule with the adaptive locus neutral there — until its last
 * event when there is no continuing migration (nothing it does later can
 * reach the recipient, so the results are the same). The record for
 * generation G is taken after the last reproduction, and the record of an
 * event generation includes the migrants (they are breeding adults of that
 * generation). Marker-based F is 1 − H_t/H_0 with H_0 the residents' marker
 * heterozygosity at the start of the phase, before any event, in both arms —
 * the pedigree's base; it can be negative once migrants bring diversity.
 *
 * @param plan - validated inputs
 * @param architecture - genome
 * @param recipient - recipient at phase start, with a founder pedigree (not modified)
 * @param source - source at phase start (not modified), or null for the no-translocation arm
 * @param recipientRandom - the recipient's phase stream (advanced)
 * @param sourceRandom - the source's phase stream (advanced; unused without translocation)
 * @returns the arm's record
 */
export function runPhase(
  plan: RescuePlan,
  architecture: GenomeArchitecture,
  recipient: Population,
  source: Population | null,
  recipientRandom: RandomStream,
  sourceRandom: RandomStream,
): ArmRecord {
  const { generations } = plan
  const record = emptyRecord(generations)
  const selection: AdaptiveSelection | null = plan.adaptive ? { s: plan.adaptive.s, h: plan.adaptive.h } : null
  const recipientScratch: ReproductionScratch = reproductionScratch(gameteScratch(architecture))
  const sourceScratch: ReproductionScratch = reproductionScratch(gameteScratch(architecture))
  let current: Population | null = recipient
  let donor: Population | null = source
  const lastEvent = plan.migrantsPerEvent > 0 ? plan.eventAt.lastIndexOf(1) : -1
  // Marker F is measured against the residents before any event, in both arms.
  const baseHeterozygosity = markerHeterozygosity(recipient, architecture)
  for (let generation = 0; generation <= generations && current; generation++) {
    if (donor && generation < generations && plan.eventAt[generation] === 1 && plan.migrantsPerEvent > 0) {
      current = withMigrants(current, donor, Math.min(plan.migrantsPerEvent, donor.size), architecture, sourceRandom)
    }
    const fitness = evaluateFitness(current, architecture, selection)
    const measures = measureGeneration(current, fitness, architecture)
    store(record, generation, measures, baseHeterozygosity)
    if (generation === generations) break
    // Without continuing migration the source is not needed after its last event: its later
    // generations could not reach the recipient, and its stream serves nothing else.
    if (donor && plan.migrationRate === 0 && generation >= lastEvent) donor = null
    const immigrants = donor && plan.migrationRate > 0 ? { source: donor, rate: plan.migrationRate } : null
    current = reproduce(current, fitness, plan.recipient.census[generation + 1] ?? 2, plan.recipient.effectiveRatio, architecture, immigrants, recipientRandom, recipientScratch)
    if (donor) {
      const donorFitness = evaluateFitness(donor, architecture, null)
      donor = reproduce(donor, donorFitness, plan.source.census[generation + 1] ?? 2, plan.source.effectiveRatio, architecture, null, sourceRandom, sourceScratch)
    }
  }
  return record
}

function emptyRecord(generations: number): ArmRecord {
  const record = {} as ArmRecord
  for (const metric of RESCUE_METRICS) record[metric] = new Float64Array(generations + 1).fill(Number.NaN)
  return record
}

function store(record: ArmRecord, generation: number, measures: GenerationMeasures, baseHeterozygosity: number): void {
  record.census[generation] = measures.census
  record.heterozygosity[generation] = measures.heterozygosity
  record.markerInbreeding[generation] = baseHeterozygosity > 0 ? 1 - measures.heterozygosity / baseHeterozygosity : Number.NaN
  record.pedigreeInbreeding[generation] = measures.pedigreeInbreeding
  record.meanFitness[generation] = measures.meanFitness
  record.inbreedingLoad[generation] = measures.inbreedingLoad
  record.driftLoad[generation] = measures.driftLoad
  record.fixedHarmful[generation] = measures.fixedHarmful
  record.adaptiveFrequency[generation] = measures.adaptiveFrequency
}
