import { quantileOfSorted } from '../summary/quantiles'
import { RESCUE_METRICS } from './types'
import type { ArmSummary, Bands, RescueMetric, RescuePartial, RescueResult } from './types'

/**
 * Turns the (merged) records of all replicates into mean and quantile bands
 * (5, 25, 50, 75, 95 %, Hyndman–Fan definition 7) of every quantity, per
 * generation and arm, plus the rescue effect: for each replicate the ratio
 * of the recipient's mean fitness with translocation to that without (the
 * paired arm from the same burn-in and stream), summarised the same way.
 * Values missing after an extinction (NaN, or null after JSON) are left out
 * of that generation's bands; a replicate counts as extinct in an arm if its
 * census is missing at the last generation.
 *
 * @param partial - records of all replicates of a run (replicates ≥ 1)
 * @returns the result of `simulateRescue`
 * @throws RangeError if the partial holds no replicates
 */
export function summarizeRescue(partial: RescuePartial): RescueResult {
  if (!(partial.replicates >= 1)) throw new RangeError(`summarizeRescue: replicates must be ≥ 1, got ${partial.replicates}`)
  const length = partial.generations + 1
  const withArm = {} as ArmSummary
  const withoutArm = {} as ArmSummary
  for (const metric of RESCUE_METRICS) {
    withArm[metric] = bandsOf(partial.withTranslocation[metric], partial.replicates, length)
    withoutArm[metric] = bandsOf(partial.withoutTranslocation[metric], partial.replicates, length)
  }
  const ratio = partial.withTranslocation.meanFitness.map((value, index) => value / (partial.withoutTranslocation.meanFitness[index] ?? Number.NaN))
  return {
    replicates: partial.replicates,
    generation: Array.from({ length }, (_, generation) => generation),
    withTranslocation: withArm,
    withoutTranslocation: withoutArm,
    rescueEffect: bandsOf(ratio, partial.replicates, length),
    extinct: {
      withTranslocation: extinctCount(partial.withTranslocation, partial.replicates, length),
      withoutTranslocation: extinctCount(partial.withoutTranslocation, partial.replicates, length),
    },
  }
}

/** Bands over replicates for each generation of a replicate-major column. */
function bandsOf(column: readonly (number | null)[], replicates: number, length: number): Bands {
  const bands: Bands = { mean: [], q05: [], q25: [], q50: [], q75: [], q95: [] }
  const values = new Float64Array(replicates)
  for (let generation = 0; generation < length; generation++) {
    let count = 0
    for (let replicate = 0; replicate < replicates; replicate++) {
      const value = column[replicate * length + generation]
      if (typeof value === 'number' && Number.isFinite(value)) values[count++] = value
    }
    const sorted = values.slice(0, count).sort()
    let sum = 0
    for (const value of sorted) sum += value
    bands.mean.push(count > 0 ? sum / count : null)
    bands.q05.push(quantileOfSorted(sorted, 0.05))
    bands.q25.push(quantileOfSorted(sorted, 0.25))
    bands.q50.push(quantileOfSorted(sorted, 0.5))
    bands.q75.push(quantileOfSorted(sorted, 0.75))
    bands.q95.push(quantileOfSorted(sorted, 0.95))
  }
  return bands
}

function extinctCount(arm: Record<RescueMetric, readonly (number | null)[]>, replicates: number, length: number): number {
  let extinct = 0
  for (let replicate = 0; replicate < replicates; replicate++) {
    const census = arm.census[replicate * length + length - 1]
    if (!(typeof census === 'number' && Number.isFinite(census))) extinct++
  }
  return extinct
}
