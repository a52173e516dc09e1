import { KERNEL_LANES, LANE_STATUS, LANE_STOPPED, LANE_WORDS } from '../kernels/drift-step-kernel'
import type { DriftStepKernel } from '../kernels/drift-step-kernel'

/**
 * A replicate written as a generator: it runs its own steps and, for each quiet stretch, puts
 * itself on lane `lane` of a kernel (`DriftStepKernel.startLane` / `resumeLane`) and yields that
 * kernel; it is resumed once its lane has stopped. It returns its outcome code.
 */
export type LaneReplicate = Generator<DriftStepKernel, number, void>

/**
 * Runs `count` replicates, up to KERNEL_LANES at a time, so that their quiet stretches share
 * kernel calls: while any replicate waits on a kernel, that kernel runs all its waiting lanes
 * until one stops, and the replicates whose lanes stopped go on.
 *
 * Why: one replicate's generations form a chain of dependent draws; several replicates side by
 * side keep the processor busy (see `DriftStepKernel`). Each replicate draws only from its own
 * stream, so the outcomes are those of running the replicates one after another; only the
 * order in which they finish changes, and callers record results by replicate index.
 *
 * @param count - number of replicates (indices 0…count − 1)
 * @param start - makes replicate `index` on lane `lane` (called in index order)
 * @param finished - receives each replicate's outcome code as it finishes
 */
export function runReplicatesOnLanes(
  count: number,
  start: (index: number, lane: number) => LaneReplicate,
  finished: (index: number, outcome: number) => void,
): void {
  const routines: (LaneReplicate | null)[] = new Array<LaneReplicate | null>(KERNEL_LANES).fill(null)
  const indices = new Int32Array(KERNEL_LANES)
  const waitingOn: (DriftStepKernel | null)[] = new Array<DriftStepKernel | null>(KERNEL_LANES).fill(null)
  let nextIndex = 0

  /** Steps lane's routine until it waits on a kernel; starts further replicates as routines finish. */
  const advance = (lane: number): void => {
    for (;;) {
      let routine = routines[lane] ?? null
      if (routine === null) {
        if (nextIndex >= count) {
          waitingOn[lane] = null
          return
        }
        indices[lane] = nextIndex
        routine = start(nextIndex++, lane)
        routines[lane] = routine
      }
      const step = routine.next()
      if (!step.done) {
        waitingOn[lane] = step.value
        return
      }
      routines[lane] = null
      finished(indices[lane] as number, step.value) // lane < KERNEL_LANES
    }
  }

  for (let lane = 0; lane < KERNEL_LANES; lane++) advance(lane)
  for (;;) {
    let kernel: DriftStepKernel | null = null
    for (let lane = 0; lane < KERNEL_LANES && kernel === null; lane++) kernel = waitingOn[lane] ?? null
    if (kernel === null) return
    kernel.runLanes()
    for (let lane = 0; lane < KERNEL_LANES; lane++) {
      if (waitingOn[lane] === kernel && kernel.lanes[lane * LANE_WORDS + LANE_STATUS] === LANE_STOPPED) advance(lane)
    }
  }
}
