import { orderIndependentMean, quantileOfHistogram, quantilesOf } from '../summary/quantiles'
import { wilsonInterval } from '../summary/wilson-interval'
import { TRAJECTORY_BINS } from './trajectory-grid'
import type { EstablishmentPartial, EstablishmentResult, TrajectoryQuantiles } from './types'

/**
 * Turns the (merged) raw outcome of all replicates into the reported
 * summary: establishment probability with its Wilson 95 % interval, waiting
 * times and frequency bands.
 *
 * Definitions: probability = established / replicates (unresolved
 * replicates count as not established); waiting-time quantiles are
 * Hyndman–Fan definition 7; frequency bands use the same definition on
 * frequencies rounded to multiples of 0.005.
 *
 * @param partial - outcome of all replicates of a run (replicates ≥ 1)
 * @returns the result object of `simulateEstablishment`
 * @throws RangeError if the partial holds no replicates
 * @example summarizeEstablishment(runEstablishmentReplicates(params, block)).probability // e.g. 0.0951
 */
export function summarizeEstablishment(partial: EstablishmentPartial): EstablishmentResult {
  if (!(partial.replicates >= 1)) throw new RangeError(`summarizeEstablishment: replicates must be ≥ 1, got ${partial.replicates}`)
  const rowLength = TRAJECTORY_BINS + 1
  const trajectory: TrajectoryQuantiles = { generation: [...partial.trajectoryGenerations], q05: [], q25: [], q50: [], q75: [], q95: [] }
  const binValue = (bin: number): number => bin / TRAJECTORY_BINS
  partial.trajectoryGenerations.forEach((_, j) => {
    const row = partial.trajectoryCounts.slice(j * rowLength, (j + 1) * rowLength)
    trajectory.q05.push(quantileOfHistogram(row, binValue, 0.05) ?? 0)
    trajectory.q25.push(quantileOfHistogram(row, binValue, 0.25) ?? 0)
    trajectory.q50.push(quantileOfHistogram(row, binValue, 0.5) ?? 0)
    trajectory.q75.push(quantileOfHistogram(row, binValue, 0.75) ?? 0)
    trajectory.q95.push(quantileOfHistogram(row, binValue, 0.95) ?? 0)
  })
  return {
    replicates: partial.replicates,
    established: partial.established,
    lost: partial.lost,
    unresolved: partial.unresolved,
    probability: partial.established / partial.replicates,
    interval95: wilsonInterval(partial.established, partial.replicates),
    meanTimeToEstablishment: orderIndependentMean(partial.establishmentTimes),
    timeToEstablishment: quantilesOf(partial.establishmentTimes),
    timeToLoss: quantilesOf(partial.lossTimes),
    trajectoryQuantiles: trajectory,
  }
}
