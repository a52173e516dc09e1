import { orderedBlocks } from '../replicate-ranges'
import { RESCUE_METRICS } from './types'
import type { RescueMetric, RescuePartial } from './types'

/**
 * Merges partial results of consecutive replicate blocks of one run (e.g.
 * from a worker pool) into one partial, as if all replicates had run in one
 * block: per-replicate records are concatenated in replicate order, so
 * 1 block of 100 and 4 blocks of 25 give identical output.
 *
 * @param partials - blocks of the same run, any order, consecutive without gaps or overlaps
 * @returns a new merged partial
 * @throws RangeError if the list is empty, blocks leave gaps or overlap, or their horizons differ
 * @example mergeRescuePartials([later, earlier]).replicates // earlier.replicates + later.replicates
 */
export function mergeRescuePartials(partials: readonly RescuePartial[]): RescuePartial {
  const fn = 'mergeRescuePartials'
  const blocks = orderedBlocks(fn, partials)
  const first = blocks[0] as RescuePartial // orderedBlocks rejects an empty list
  const merged: RescuePartial = {
    firstReplicate: first.firstReplicate,
    replicates: 0,
    generations: first.generations,
    withTranslocation: emptyArm(),
    withoutTranslocation: emptyArm(),
  }
  for (const block of blocks) {
    if (block.generations !== first.generations) {
      throw new RangeError(`${fn}: partials must come from the same inputs, got horizons ${first.generations} and ${block.generations}`)
    }
    merged.replicates += block.replicates
    for (const metric of RESCUE_METRICS) {
      merged.withTranslocation[metric].push(...block.withTranslocation[metric])
      merged.withoutTranslocation[metric].push(...block.withoutTranslocation[metric])
    }
  }
  return merged
}

function emptyArm(): Record<RescueMetric, number[]> {
  const arm = {} as Record<RescueMetric, number[]>
  for (const metric of RESCUE_METRICS) arm[metric] = []
  return arm
}
