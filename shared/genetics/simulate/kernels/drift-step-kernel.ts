import { xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus'
import type { JumpableRandomGenerator } from 'pure-rand/types/JumpableRandomGenerator'
import type { RandomStream } from '../random/streams'
import { readKernelState, writeKernelState } from '../random/word-stream'
import { driftStepWasm } from './drift-step-wasm'
import { kernelMemory, kernelModule } from './instantiate'

/** Doubles per count in the header area: state, binomialSetup's 7 entries, 0.86·v_r, 2a, table length, spare. */
export const KERNEL_HEADER_STRIDE = 12
/**
 * Doubles per count in the table area: room for a BTRD acceptance table (35 entries) or an
 * inversion pmf table, whose length is ⌊min(n, m + 10√(m(1 − p) + 1))⌋ + 1 ≤ 44 for a mean m < 10.
 */
export const KERNEL_TABLE_SLOT = 44
/** Replicates the kernel interleaves (lanes); more than the processor can overlap gains nothing. */
export const KERNEL_LANES = 8
/** int32 words per lane record; the record buffer starts at word LANE_RECORDS and holds LANE_RECORD_CAPACITY counts. */
export const LANE_WORDS = 80
export const LANE_RECORDS = 16
export const LANE_RECORD_CAPACITY = 64
/** Words of a lane record (see kernels/drift-step.ts `runLanes`). */
export const LANE_COUNT = 4
export const LANE_GENERATION = 5
export const LANE_END = 6
export const LANE_GRID_INDEX = 7
export const LANE_RECORDED = 8
export const LANE_STATUS = 9
/** The next generation at which the kernel must look at the lane: min(end, next grid point). */
const LANE_STOP_AT = 10
export const LANE_RUNNING = 1
export const LANE_STOPPED = 2

type RunLanesExport = (laneCount: number, genes: number, headerBase: number, tableBase: number, gridBase: number, gridLength: number) => void

/**
 * The WebAssembly drift-step kernel (kernels/drift-step.ts) for one number of sampled genes n:
 * its memory holds the per-count constants of a `DriftStepCache`, the trajectory grid and up to
 * KERNEL_LANES lanes, each a replicate in a quiet stretch (no event, no migration, constant n).
 *
 * Why: the allele-frequency simulation is one binomial draw per replicate-generation, a chain in
 * which each draw waits for the previous one (two divisions and a load); the kernel runs several
 * replicates' chains side by side so that the processor overlaps them, without leaving
 * WebAssembly between generations. Each lane continues its replicate's own xoroshiro128+ stream
 * (pure-rand's algorithm, operation for operation) and makes bit-for-bit the draws of
 * `DriftStepCache.draw`, so interleaving never changes a result
 * (tests/unit/simulation/drift-step-kernel.test.ts).
 *
 * The arrays below are views of the kernel's memory, which never grows, so they stay valid;
 * `DriftStepCache` fills the constants and its TypeScript `draw` reads the same numbers.
 */
export class DriftStepKernel {
  /** Per-count constants, KERNEL_HEADER_STRIDE doubles per count 0…n. */
  readonly headers: Float64Array
  /** Per-count tables, KERNEL_TABLE_SLOT doubles per count 0…n. */
  readonly tables: Float64Array
  /** Lane records, LANE_WORDS int32 per lane. */
  readonly lanes: Int32Array
  private readonly genes: number
  private readonly gridBase: number
  /** The grid, a view of its copy in the kernel's memory. */
  private readonly grid: Int32Array
  private readonly headerBase: number
  private readonly tableBase: number
  private readonly runLanesExport: RunLanesExport

  /**
   * @param genes - n, integer ≥ 1
   * @param grid - generations at which lanes record their count (increasing)
   */
  constructor(genes: number, grid: Int32Array) {
    this.genes = genes
    const counts = genes + 1
    this.gridBase = KERNEL_LANES * LANE_WORDS * 4
    this.headerBase = this.gridBase + Math.ceil(grid.length / 2) * 8
    this.tableBase = this.headerBase + counts * KERNEL_HEADER_STRIDE * 8
    const bytes = this.tableBase + counts * KERNEL_TABLE_SLOT * 8
    const memory = kernelMemory(bytes)
    const instance = new WebAssembly.Instance(kernelModule(driftStepWasm), { env: { memory } })
    this.runLanesExport = instance.exports.runLanes as RunLanesExport
    this.lanes = new Int32Array(memory.buffer, 0, KERNEL_LANES * LANE_WORDS)
    this.grid = new Int32Array(memory.buffer, this.gridBase, grid.length)
    this.grid.set(grid)
    this.headers = new Float64Array(memory.buffer, this.headerBase, counts * KERNEL_HEADER_STRIDE)
    this.tables = new Float64Array(memory.buffer, this.tableBase, counts * KERNEL_TABLE_SLOT)
  }

  /**
   * Puts a replicate on a lane: from `copies` (1 ≤ copies ≤ n − 1) at `generation`, drawing until
   * `end` (exclusive), continuing the stream of `random`; `gridIndex` is the first grid point at
   * or after `generation`. The lane runs at the next `runLanes`.
   */
  startLane(lane: number, random: RandomStream, copies: number, generation: number, end: number, gridIndex: number): void {
    const at = lane * LANE_WORDS
    writeKernelState(random.getState(), this.lanes, at)
    this.lanes[at + LANE_COUNT] = copies
    this.lanes[at + LANE_GENERATION] = generation
    this.lanes[at + LANE_END] = end
    this.lanes[at + LANE_GRID_INDEX] = gridIndex
    this.lanes[at + LANE_STOP_AT] = gridIndex < this.grid.length ? Math.min(end, this.grid[gridIndex] as number) : end
    this.lanes[at + LANE_RECORDED] = 0
    this.lanes[at + LANE_STATUS] = LANE_RUNNING
  }

  /** Lets a stopped lane go on from where it stopped (after its buffer was read or its count filled). */
  resumeLane(lane: number): void {
    const at = lane * LANE_WORDS
    this.lanes[at + LANE_RECORDED] = 0
    this.lanes[at + LANE_STATUS] = LANE_RUNNING
  }

  /** Runs the running lanes until at least one stops (see kernels/drift-step.ts `runLanes`). */
  runLanes(): void {
    this.runLanesExport(KERNEL_LANES, this.genes, this.headerBase, this.tableBase, this.gridBase, this.grid.length)
  }

  /** A generator positioned where a lane's stream stands (pure-rand's xoroshiro128+). */
  laneStream(lane: number): JumpableRandomGenerator {
    return xoroshiro128plusFromState(readKernelState(this.lanes, lane * LANE_WORDS))
  }
}
