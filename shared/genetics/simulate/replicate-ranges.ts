import { requireInteger } from '../validate'

/** A contiguous block of replicate indices handed to one worker. */
export interface ReplicateRange {
  /** Index of the first replicate in the block, ≥ 0. */
  first: number
  /** Number of replicates in the block, ≥ 0. */
  count: number
}

/**
 * Splits replicates 0…total−1 into `parts` contiguous blocks whose sizes
 * differ by at most one (earlier blocks take the extra replicates).
 *
 * Why: a worker pool runs one block per thread; because every replicate has
 * its own random stream (`replicateStream`), merging the blocks' partial
 * results gives exactly the single-thread answer.
 *
 * @param total - number of replicates, integer ≥ 0
 * @param parts - number of blocks, integer ≥ 1 (blocks may be empty when parts > total)
 * @returns `parts` ranges covering 0…total−1 in order
 * @throws RangeError if an argument is not an integer in its domain
 * @example splitReplicates(10, 3) // [{first: 0, count: 4}, {first: 4, count: 3}, {first: 7, count: 3}]
 * @example splitReplicates(2, 3)  // [{first: 0, count: 1}, {first: 1, count: 1}, {first: 2, count: 0}]
 */
export function splitReplicates(total: number, parts: number): ReplicateRange[] {
  requireInteger('splitReplicates', 'total', total, 0)
  requireInteger('splitReplicates', 'parts', parts, 1)
  const base = Math.floor(total / parts)
  const extra = total % parts
  const ranges: ReplicateRange[] = []
  let first = 0
  for (let part = 0; part < parts; part++) {
    const count = base + (part < extra ? 1 : 0)
    ranges.push({ first, count })
    first += count
  }
  return ranges
}

/**
 * Checks that partial results cover consecutive replicate blocks and returns
 * them ordered by their first replicate.
 *
 * @param fn - calling function's name, for error messages
 * @param partials - blocks with `firstReplicate` and `replicates`
 * @returns a new array sorted by `firstReplicate`
 * @throws RangeError if the list is empty, or blocks overlap or leave gaps
 * @example orderedBlocks('merge', [{ firstReplicate: 5, replicates: 5 }, { firstReplicate: 0, replicates: 5 }])
 *   // [{ firstReplicate: 0, … }, { firstReplicate: 5, … }]
 */
export function orderedBlocks<T extends { firstReplicate: number, replicates: number }>(fn: string, partials: readonly T[]): T[] {
  if (partials.length === 0) throw new RangeError(`${fn}: partials must be a non-empty array, got []`)
  const sorted = [...partials].sort((a, b) => a.firstReplicate - b.firstReplicate)
  let expected = sorted[0]?.firstReplicate ?? 0
  for (const block of sorted) {
    if (block.firstReplicate !== expected) {
      throw new RangeError(`${fn}: partials must cover consecutive replicate blocks, got a block starting at ${block.firstReplicate} where ${expected} was expected`)
    }
    expected += block.replicates
  }
  return sorted
}
