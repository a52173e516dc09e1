import { orderedBlocks } from '../replicate-ranges'
import type { EstablishmentPartial } from './types'

/**
 * Merges partial results of consecutive replicate blocks (e.g. from a worker
 * pool) into one partial, as if all replicates had run in one block.
 *
 * Counts and histograms are summed; waiting times are concatenated in
 * replicate order, so 1 block of 100 and 4 blocks of 25 give identical output.
 *
 * @param partials - blocks of the same run (same params and seed), in any
 *   order, covering consecutive replicates without gaps or overlaps
 * @returns a new merged partial
 * @throws RangeError if the list is empty, blocks leave gaps or overlap, or
 *   the blocks' trajectory grids differ (different params)
 * @example mergeEstablishmentPartials([blockB, blockA]).replicates // blockA.replicates + blockB.replicates
 */
export function mergeEstablishmentPartials(partials: readonly EstablishmentPartial[]): EstablishmentPartial {
  const fn = 'mergeEstablishmentPartials'
  const blocks = orderedBlocks(fn, partials)
  const first = blocks[0] as EstablishmentPartial // orderedBlocks rejects an empty list
  const trajectoryCounts = new Array<number>(first.trajectoryCounts.length).fill(0)
  const merged: EstablishmentPartial = {
    firstReplicate: first.firstReplicate,
    replicates: 0,
    established: 0,
    lost: 0,
    unresolved: 0,
    establishmentTimes: [],
    lossTimes: [],
    trajectoryGenerations: [...first.trajectoryGenerations],
    trajectoryCounts,
  }
  for (const block of blocks) {
    if (block.trajectoryCounts.length !== trajectoryCounts.length
      || block.trajectoryGenerations.length !== first.trajectoryGenerations.length
      || block.trajectoryGenerations.some((generation, j) => generation !== first.trajectoryGenerations[j])) {
      throw new RangeError(`${fn}: partials must come from the same inputs, got blocks with different trajectory grids`)
    }
    merged.replicates += block.replicates
    merged.established += block.established
    merged.lost += block.lost
    merged.unresolved += block.unresolved
    merged.establishmentTimes.push(...block.establishmentTimes)
    merged.lossTimes.push(...block.lossTimes)
    for (let index = 0; index < trajectoryCounts.length; index++) {
      trajectoryCounts[index] = (trajectoryCounts[index] ?? 0) + (block.trajectoryCounts[index] ?? 0)
    }
  }
  return merged
}
