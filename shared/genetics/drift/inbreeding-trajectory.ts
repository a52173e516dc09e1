import { domainError, requireInRange } from '../validate'
import { requireEffectiveSize } from './effective-size-domain'
import { inbreedingAtGeneration, islandModelSolution } from './island-model-solution'

/** Longest trajectory returned, in generations (keeps the array a sane size for charts). */
export const MAXIMUM_TRAJECTORY_GENERATIONS = 1_000_000

/**
 * Expected inbreeding for every generation from 0 to t: the series behind
 * the "F with and without gene flow" chart.
 *
 * Why: the UI shows the time course of F, not only its end point or
 * equilibrium; the approach to equilibrium can take hundreds of generations
 * (SCIENCE.md §4.2, §4.3).
 *
 * Formula: element i is F_i of the island-model recurrence (SCIENCE.md
 * eq. 4.2), F_i = (1 − m)²·[1/(2Ne) + (1 − 1/(2Ne))·F_(i−1)], with F_0 the
 * starting inbreeding; each element is computed from the exact solution of
 * the recurrence, so element i equals `inbreedingAfter` at t = i exactly.
 * Assumptions: as for `inbreedingAfter` (ideal population, constant Ne and m,
 * unrelated immigrants from a large source, neutral loci).
 * Reference: Wright, S. (1931). Evolution in Mendelian populations.
 *   Genetics 16: 97–159.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param generations - t, whole generations, 0 ≤ t ≤ 1 000 000
 * @param initialInbreeding - F_0, in [0, 1]; default 0
 * @param migrationRate - m, fraction of genes per generation from immigrants,
 *   in [0, 1]; default 0
 * @returns a new array of t + 1 values [F_0, F_1, …, F_t], each in [0, 1]
 * @throws RangeError if an argument is outside its domain
 * @example inbreedingTrajectory({ effectiveSize: 10, generations: 2 })
 *   // [0, 0.05, 0.0975]
 * @example inbreedingTrajectory({ effectiveSize: 20, generations: 1, initialInbreeding: 0.25, migrationRate: 0.2 })
 *   // [0.25, 0.17200000000000001]
 * @example inbreedingTrajectory({ effectiveSize: 50, generations: 0, initialInbreeding: 0.1 })  // [0.1]
 */
export function inbreedingTrajectory({ effectiveSize, generations, initialInbreeding = 0, migrationRate = 0 }: {
  effectiveSize: number
  generations: number
  initialInbreeding?: number
  migrationRate?: number
}): number[] {
  const fn = 'inbreedingTrajectory'
  requireEffectiveSize(fn, 'effectiveSize', effectiveSize)
  if (typeof generations !== 'number' || !Number.isInteger(generations) || generations < 0 || generations > MAXIMUM_TRAJECTORY_GENERATIONS) {
    domainError(fn, 'generations', `an integer in [0, ${MAXIMUM_TRAJECTORY_GENERATIONS}]`, generations)
  }
  requireInRange(fn, 'initialInbreeding', initialInbreeding, 0, 1)
  requireInRange(fn, 'migrationRate', migrationRate, 0, 1)
  const solution = islandModelSolution(effectiveSize, migrationRate)
  const trajectory: number[] = []
  for (let generation = 0; generation <= generations; generation++) {
    trajectory.push(inbreedingAtGeneration(solution, initialInbreeding, generation))
  }
  return trajectory
}
