import { requireInteger } from '../../validate'
import { binomialDraw } from '../random/binomial'
import { ReplicateStreams } from '../random/streams'
import type { RandomStream } from '../random/streams'
import { LANE_COUNT, LANE_GENERATION, LANE_GRID_INDEX, LANE_RECORDED, LANE_RECORDS, LANE_WORDS } from '../kernels/drift-step-kernel'
import { DriftStepCache, MAXIMUM_CACHED_GENES } from './drift-step-cache'
import { establishmentPlan } from './establishment-plan'
import type { EstablishmentPlan } from './establishment-plan'
import { frequencyAfterSelection } from './selection-step'
import { runReplicatesOnLanes } from './replicate-lanes'
import type { LaneReplicate } from './replicate-lanes'
import { frequencyBin, TRAJECTORY_BINS, trajectoryGrid } from './trajectory-grid'
import type { EstablishmentParams, EstablishmentPartial } from './types'

/** Which replicates of a run to simulate, and with which seed. */
export interface ReplicateBlock {
  /** Seed of the whole run, integer (low 32 bits used). */
  seed: number
  /** Index of the first replicate of this block, integer ≥ 0. */
  firstReplicate: number
  /** Number of replicates in this block, integer ≥ 0. */
  replicates: number
  /** Called now and then with (replicates done in this block, block size). */
  onProgress?: (completed: number, total: number) => void
}

const UNRESOLVED = 0
const ESTABLISHED = 1
const LOST = 2

/** Mutable tallies of one block. */
interface BlockTally {
  plan: EstablishmentPlan
  grid: Int32Array
  /** Histogram rows [grid point][bin] of frequencies recorded while running. */
  counts: Int32Array
  /** lostFrom[j]: replicates absorbed at 0 before grid point j was recorded. */
  lostFrom: Int32Array
  /** fixedFrom[j]: replicates fixed before grid point j was recorded. */
  fixedFrom: Int32Array
  /** times[r]: generations from the time origin to replicate r's fixation or loss. */
  times: Float64Array
  /** Drift-step caches per number of sampled genes (n ≤ MAXIMUM_CACHED_GENES), built on demand. */
  caches: Map<number, DriftStepCache>
  /**
   * quietUntil[g]: the first generation after g at which an event happens or
   * the number of sampled genes changes (the horizon if none) — generations
   * g…quietUntil[g] − 1 can run in the tight drift-only loop.
   */
  quietUntil: Int32Array
}

/** See `BlockTally.quietUntil`. */
function quietStretches(plan: EstablishmentPlan): Int32Array {
  const { generations, eventAt, sampledGenes } = plan
  const until = new Int32Array(generations)
  let next = generations
  for (let generation = generations - 1; generation >= 0; generation--) {
    until[generation] = next
    if (eventAt[generation] === 1 || (generation > 0 && sampledGenes[generation] !== sampledGenes[generation - 1])) next = generation
  }
  return until
}

/**
 * Simulates one block of replicates of the allele-frequency model and returns
 * its mergeable raw outcome (see `simulateEstablishment` for the model).
 *
 * Replicate r always uses `replicateStream(seed, r)`, so any split of
 * 0…R−1 into blocks, merged with `mergeEstablishmentPartials`, reproduces
 * the single-block result exactly.
 *
 * @param params - model inputs (see `EstablishmentParams`)
 * @param block - seed and replicate range
 * @returns the block's partial result
 * @throws RangeError if an input is outside its domain
 * @example runEstablishmentReplicates(params, { seed: 1, firstReplicate: 0, replicates: 25 }).replicates // 25
 */
export function runEstablishmentReplicates(params: EstablishmentParams, block: ReplicateBlock): EstablishmentPartial {
  return runEstablishmentBlock('runEstablishmentReplicates', params, block)
}

/**
 * `runEstablishmentReplicates` with the caller's name in error messages.
 *
 * @param fn - public function name reported by RangeErrors
 * @param params - model inputs
 * @param block - seed and replicate range
 * @returns the block's partial result
 */
export function runEstablishmentBlock(fn: string, params: EstablishmentParams, block: ReplicateBlock): EstablishmentPartial {
  requireInteger(fn, 'firstReplicate', block.firstReplicate, 0)
  requireInteger(fn, 'replicates', block.replicates, 0)
  if (typeof block.seed !== 'number' || !Number.isInteger(block.seed)) throw new RangeError(`${fn}: seed must be an integer, got ${String(block.seed)}`)
  const plan = establishmentPlan(fn, params)
  const gridGenerations = trajectoryGrid(plan.generations)
  const gridLength = gridGenerations.length
  const tally: BlockTally = {
    plan,
    grid: Int32Array.from(gridGenerations),
    counts: new Int32Array(gridLength * (TRAJECTORY_BINS + 1)),
    lostFrom: new Int32Array(gridLength + 1),
    fixedFrom: new Int32Array(gridLength + 1),
    times: new Float64Array(block.replicates),
    caches: new Map(),
    quietUntil: quietStretches(plan),
  }
  const streams = new ReplicateStreams(block.seed, block.firstReplicate)
  const progressStep = Math.max(1, Math.floor(block.replicates / 100))
  const outcomes = new Uint8Array(block.replicates)
  let completed = 0
  runReplicatesOnLanes(
    block.replicates,
    (replicate, lane) => replicateRun(tally, streams.next(), replicate, lane),
    (replicate, outcome) => {
      outcomes[replicate] = outcome
      completed++
      if (block.onProgress && (completed % progressStep === 0 || completed === block.replicates)) {
        block.onProgress(completed, block.replicates)
      }
    },
  )
  let established = 0
  let lost = 0
  const establishmentTimes: number[] = []
  const lossTimes: number[] = []
  for (let replicate = 0; replicate < block.replicates; replicate++) {
    if (outcomes[replicate] === ESTABLISHED) {
      established++
      establishmentTimes.push(tally.times[replicate] as number) // replicate < length
    } else if (outcomes[replicate] === LOST) {
      lost++
      lossTimes.push(tally.times[replicate] as number)
    }
  }
  // Absorbed replicates contribute bin 0 or bin 200 to every later grid point.
  let lostSoFar = 0
  let fixedSoFar = 0
  for (let j = 0; j < gridLength; j++) {
    lostSoFar += tally.lostFrom[j] ?? 0
    fixedSoFar += tally.fixedFrom[j] ?? 0
    const row = j * (TRAJECTORY_BINS + 1)
    tally.counts[row] = (tally.counts[row] ?? 0) + lostSoFar
    tally.counts[row + TRAJECTORY_BINS] = (tally.counts[row + TRAJECTORY_BINS] ?? 0) + fixedSoFar
  }
  return {
    firstReplicate: block.firstReplicate,
    replicates: block.replicates,
    established,
    lost,
    unresolved: block.replicates - established - lost,
    establishmentTimes,
    lossTimes,
    trajectoryGenerations: gridGenerations,
    trajectoryCounts: Array.from(tally.counts),
  }
}

/**
 * One replicate: generation by generation, translocation (adding migrants'
 * genes), continuing migration, recording, selection, Wright–Fisher drift,
 * until fixation, definitive loss or the horizon. A generator: for each quiet
 * stretch it puts itself on lane `lane` of the drift-step kernel and yields
 * that kernel (see replicate-lanes.ts); it returns its outcome code.
 */
function* replicateRun(tally: BlockTally, random: RandomStream, replicate: number, lane: number): LaneReplicate {
  const { plan, grid, counts, quietUntil } = tally
  const { generations, census, sampledGenes, eventAt, s, h, sourceFrequency, introducedCopies, migrantsPerEvent, migrationRate, lastInputGeneration } = plan
  const stayWeight = 1 - migrationRate
  const immigrantShare = migrationRate * sourceFrequency
  const gridLength = grid.length
  let gridIndex = 0
  let nextGrid = grid[0] ?? 0
  let frequency = 0
  // When the frequency is exactly copies/genesOfCopies (a drift step and
  // nothing since), the next step can use the cached constants of that count.
  let copies = 0
  let genesOfCopies = 0
  let cache: DriftStepCache | undefined
  let generation = 0
  while (generation < generations) {
    // Quiet stretch: no event, no migration, the same number of genes as the
    // last drift step and the allele segregating — only record and draw.
    // (The same steps as the general loop below, in the same order.)
    if (migrationRate === 0 && genesOfCopies > 0 && copies > 0 && copies < genesOfCopies && cache !== undefined
      && cache.genes === genesOfCopies && eventAt[generation] !== 1 && sampledGenes[generation] === genesOfCopies) {
      // The generations of the stretch run on a lane of the WebAssembly kernel, which records
      // the count at grid points and continues this replicate's stream (see replicate-lanes.ts).
      const genes = genesOfCopies
      const end = quietUntil[generation] ?? generations
      const kernel = cache.kernel
      const lanes = kernel.lanes
      const at = lane * LANE_WORDS
      kernel.startLane(lane, random, copies, generation, end, gridIndex)
      for (;;) {
        yield kernel
        const recorded = lanes[at + LANE_RECORDED] as number // lane words exist
        for (let record = 0; record < recorded; record++) {
          const index = (gridIndex + record) * (TRAJECTORY_BINS + 1) + frequencyBin((lanes[at + LANE_RECORDS + record] as number) / genes)
          counts[index] = (counts[index] ?? 0) + 1
        }
        copies = lanes[at + LANE_COUNT] as number
        generation = lanes[at + LANE_GENERATION] as number
        gridIndex = lanes[at + LANE_GRID_INDEX] as number
        if (copies === genes || copies === 0 || generation >= end) break
        cache.prepare(copies) // the lane may have stopped before a count not filled yet
        kernel.resumeLane(lane)
      }
      nextGrid = gridIndex < gridLength ? grid[gridIndex] ?? -1 : -1
      random = kernel.laneStream(lane)
      if (copies === genes) return finishFixed(tally, replicate, generation, gridIndex)
      if (copies === 0 && generation > lastInputGeneration) return finishLost(tally, replicate, generation, gridIndex)
      frequency = copies / genes
      continue
    }
    if (eventAt[generation] === 1) {
      const twiceCensus = 2 * (census[generation] ?? 1)
      const arriving = introducedCopies >= 0 ? introducedCopies : binomialDraw(random, 2 * migrantsPerEvent, sourceFrequency)
      frequency = migrantsPerEvent > 0
        ? (twiceCensus * frequency + arriving) / (twiceCensus + 2 * migrantsPerEvent)
        : Math.min(1, frequency + (1 - frequency) * arriving / twiceCensus)
      genesOfCopies = 0
    }
    if (migrationRate > 0) {
      frequency = stayWeight * frequency + immigrantShare
      genesOfCopies = 0
    }
    if (generation === nextGrid) {
      const index = gridIndex * (TRAJECTORY_BINS + 1) + frequencyBin(frequency)
      counts[index] = (counts[index] ?? 0) + 1
      gridIndex++
      nextGrid = gridIndex < gridLength ? grid[gridIndex] ?? -1 : -1
    }
    if (frequency === 0) {
      if (generation >= lastInputGeneration) return finishLost(tally, replicate, generation, gridIndex)
      generation++
      continue // nothing can happen until the next input
    }
    if (frequency >= 1) return finishFixed(tally, replicate, generation, gridIndex)
    const genes = sampledGenes[generation] ?? 1
    if (genes === genesOfCopies && genes <= MAXIMUM_CACHED_GENES) {
      if (cache === undefined || cache.genes !== genes) cache = cacheFor(tally, genes)
      copies = cache.draw(random, copies)
    } else {
      copies = binomialDraw(random, genes, frequencyAfterSelection(frequency, s, h))
      if (genes <= MAXIMUM_CACHED_GENES && (cache === undefined || cache.genes !== genes)) cache = cacheFor(tally, genes)
    }
    genesOfCopies = genes
    if (copies === genes) return finishFixed(tally, replicate, generation + 1, gridIndex)
    frequency = copies / genes
    if (copies === 0 && generation + 1 > lastInputGeneration) return finishLost(tally, replicate, generation + 1, gridIndex)
    generation++
  }
  if (generations === nextGrid) {
    const index = gridIndex * (TRAJECTORY_BINS + 1) + frequencyBin(frequency)
    counts[index] = (counts[index] ?? 0) + 1
  }
  return UNRESOLVED
}

function cacheFor(tally: BlockTally, genes: number): DriftStepCache {
  let cache = tally.caches.get(genes)
  if (!cache) {
    cache = new DriftStepCache(genes, tally.plan.s, tally.plan.h, tally.grid)
    tally.caches.set(genes, cache)
  }
  return cache
}

function finishFixed(tally: BlockTally, replicate: number, generation: number, gridIndex: number): number {
  tally.fixedFrom[gridIndex] = (tally.fixedFrom[gridIndex] ?? 0) + 1
  tally.times[replicate] = generation - tally.plan.timeOrigin
  return ESTABLISHED
}

function finishLost(tally: BlockTally, replicate: number, generation: number, gridIndex: number): number {
  tally.lostFrom[gridIndex] = (tally.lostFrom[gridIndex] ?? 0) + 1
  tally.times[replicate] = generation - tally.plan.timeOrigin
  return LOST
}
