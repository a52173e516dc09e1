import { spawnStream } from '../random/streams'
import type { RandomStream } from '../random/streams'
import type { GenomeArchitecture } from './architecture'
import { burnIn } from './burn-in'
import { assignAdaptiveAlleles } from './founders'
import { founderPedigree } from './pedigree'
import type { RescuePlan } from './rescue-plan'
import { runPhase } from './run-phase'
import type { ArmRecord } from './run-phase'
import { RESCUE_METRICS } from './types'

/** Both arms of one replicate. */
export interface ReplicateRecord {
  withTranslocation: ArmRecord
  withoutTranslocation: ArmRecord
}

/**
 * One replicate: burn in the recipient and the source (each from its own
 * child stream), give the adaptive allele its starting frequencies, set the
 * recipient's pedigree base (all founders), then run the phase twice from
 * the same populations and the same generator state — with and without
 * translocation — so the difference between the arms is the effect of the
 * translocations, not of a different history (common random numbers).
 * When the schedule moves no animals and m = 0 the source is not simulated
 * and the two arms are identical.
 *
 * @param plan - validated inputs
 * @param architecture - genome
 * @param random - the replicate's stream (`replicateStream(seed, r)`)
 * @returns the two arms' records (all NaN if the recipient died out in its burn-in)
 */
export function runRescueReplicate(plan: RescuePlan, architecture: GenomeArchitecture, random: RandomStream): ReplicateRecord {
  const recipientBurnIn = spawnStream(random)
  const sourceBurnIn = spawnStream(random)
  const recipientPhase = spawnStream(random)
  const sourcePhase = spawnStream(random)
  const recipient = burnIn(plan.recipient, architecture, recipientBurnIn)
  // Without any gene flow the source cannot affect the recipient: skip it.
  const source = sourceNeeded(plan) ? burnIn(plan.source, architecture, sourceBurnIn) : null
  if (!recipient) return { withTranslocation: extinctRecord(plan.generations), withoutTranslocation: extinctRecord(plan.generations) }
  assignAdaptiveAlleles(recipient, plan.adaptive?.recipientFrequency ?? 0, recipientBurnIn)
  if (source) assignAdaptiveAlleles(source, plan.adaptive?.sourceFrequency ?? 0, sourceBurnIn)
  recipient.pedigree = founderPedigree(recipient.size)
  return {
    withTranslocation: runPhase(plan, architecture, recipient, source, recipientPhase.clone(), sourcePhase),
    withoutTranslocation: runPhase(plan, architecture, recipient, null, recipientPhase, sourcePhase.clone()),
  }
}

function sourceNeeded(plan: RescuePlan): boolean {
  return plan.migrationRate > 0 || (plan.migrantsPerEvent > 0 && plan.eventAt.includes(1))
}

function extinctRecord(generations: number): ArmRecord {
  const record = {} as ArmRecord
  for (const metric of RESCUE_METRICS) record[metric] = new Float64Array(generations + 1).fill(Number.NaN)
  return record
}
