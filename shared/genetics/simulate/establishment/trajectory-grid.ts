/** Number of frequency bins of the trajectory histograms (bin width 1/200 = 0.005). */
export const TRAJECTORY_BINS = 200

/** Largest number of grid intervals of a trajectory (201 grid points). */
export const MAXIMUM_TRAJECTORY_INTERVALS = 200

/**
 * Generations at which the frequency bands are recorded: every generation
 * 0…G when G ≤ 200, otherwise 201 points round(j·G/200), j = 0…200 (distinct
 * because G > 200).
 *
 * @param generations - horizon G, integer ≥ 1
 * @returns increasing generations starting at 0 and ending at G
 * @example trajectoryGrid(3)    // [0, 1, 2, 3]
 * @example trajectoryGrid(1000).length // 201
 */
export function trajectoryGrid(generations: number): number[] {
  const intervals = Math.min(generations, MAXIMUM_TRAJECTORY_INTERVALS)
  const grid: number[] = []
  for (let j = 0; j <= intervals; j++) grid.push(Math.round(j * generations / intervals))
  return grid
}

/**
 * Histogram bin of a frequency: round(p·200), so bins are centred on
 * multiples of 0.005 and frequency 1 has its own bin (200).
 *
 * @param frequency - p in [0, 1]
 * @returns an integer in [0, 200]
 * @example frequencyBin(0) // 0
 * @example frequencyBin(0.0123) // 2
 * @example frequencyBin(1) // 200
 */
export function frequencyBin(frequency: number): number {
  return Math.round(frequency * TRAJECTORY_BINS)
}
