/**
 * Speed of the exact Wright–Fisher chain (shared/genetics/exact): one call of
 * exactFixationProbabilities (all 2N + 1 starts) per case, best of several
 * runs after a warm-up, single-threaded. The figure compared with the bars is
 * the process CPU time of the call (process.cpuUsage), which other jobs on a
 * shared machine disturb far less than the wall-clock time printed beside it.
 *
 * Bars: census 1000 (2001 states) ≤ 0.5 s and census 2000 ≤ 3 s. Reference:
 * a dense LU solve with scipy took 1.15 s for census 1000 on this machine
 * (figure from the issue text, not re-measured here).
 */
import { exactConditionalFixationTimes, exactFixationProbabilities } from '../shared/genetics/exact'

const BARS: Record<number, number> = { 1000: 0.5, 2000: 3 }
const DENSE_LU_CENSUS_1000_SECONDS = 1.15

interface Timing { cpu: number, wall: number }

function bestTiming(run: () => void, repeats: number): Timing {
  const best = { cpu: Number.POSITIVE_INFINITY, wall: Number.POSITIVE_INFINITY }
  for (let r = 0; r < repeats; r++) {
    const cpuBefore = process.cpuUsage()
    const wallBefore = performance.now()
    run()
    const wall = (performance.now() - wallBefore) / 1000
    const { user, system } = process.cpuUsage(cpuBefore)
    best.cpu = Math.min(best.cpu, (user + system) / 1e6)
    best.wall = Math.min(best.wall, wall)
  }
  return best
}

export default async function (): Promise<void> {
  exactFixationProbabilities({ census: 200, s: 0.01, h: 0.5 }) // warm-up (JIT)
  const cases = [
    { census: 100, s: 0.01, h: 0.5, repeats: 10 },
    { census: 500, s: 0.01, h: 0.5, repeats: 5 },
    { census: 1000, s: 0.01, h: 0.5, repeats: 5 },
    { census: 1000, s: -0.1, h: 0.5, repeats: 3 },
    { census: 1000, s: 0.5, h: 1, repeats: 3 },
    { census: 2000, s: 0.01, h: 0.5, repeats: 3 },
    { census: 2000, s: -0.1, h: 0, repeats: 2 },
  ]
  console.log('fixation probability vector (all starts), single thread; CPU seconds (wall seconds):')
  for (const { census, s, h, repeats } of cases) {
    const { cpu, wall } = bestTiming(() => exactFixationProbabilities({ census, s, h }), repeats)
    const bar = BARS[census]
    const parts = [`census ${String(census).padStart(4)} (${2 * census + 1} states), s = ${s}, h = ${h}: ${cpu.toFixed(3)} s (${wall.toFixed(3)} s)`]
    if (bar !== undefined) parts.push(`${(cpu / bar).toFixed(2)} × bar (${bar} s)`)
    if (census === 1000) parts.push(`${(cpu / DENSE_LU_CENSUS_1000_SECONDS).toFixed(2)} × dense LU (${DENSE_LU_CENSUS_1000_SECONDS} s)`)
    console.log('  ' + parts.join('; '))
  }
  const times = bestTiming(() => exactConditionalFixationTimes({ census: 1000, s: 0.01, h: 0.5 }), 3)
  console.log(`conditional fixation times (all starts), census 1000, s = 0.01, h = 0.5: ${times.cpu.toFixed(3)} s (${times.wall.toFixed(3)} s)`)
}
