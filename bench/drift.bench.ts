/**
 * Drift and inbreeding projections: cost per call of the closed-form
 * island-model solution versus literal iteration of the recurrence, and the
 * cost of a chart-sized trajectory. `npx tsx bench/run.ts drift`.
 */
import { performance } from 'node:perf_hooks'
import { heterozygosityRetained, inbreedingAfter, inbreedingTrajectory } from '../shared/genetics/drift'
import { effectiveSizeForInbreedingTarget } from '../shared/genetics/effective-size'
import { relativeFitness } from '../shared/genetics/load'

function timePerCall(label: string, calls: number, body: (i: number) => number): number {
  let sink = 0
  for (let i = 0; i < Math.min(calls, 10_000); i++) sink += body(i) // warm-up
  const start = performance.now()
  for (let i = 0; i < calls; i++) sink += body(i)
  const nanoseconds = ((performance.now() - start) * 1e6) / calls
  console.log(`${label.padEnd(58)} ${nanoseconds.toFixed(1).padStart(10)} ns/call  (checksum ${sink.toPrecision(6)})`)
  return nanoseconds
}

function literalIteration(effectiveSize: number, generations: number, initialInbreeding: number, migrationRate: number): number {
  let inbreeding = initialInbreeding
  for (let generation = 0; generation < generations; generation++) {
    inbreeding = (1 - migrationRate) ** 2 * (1 / (2 * effectiveSize) + (1 - 1 / (2 * effectiveSize)) * inbreeding)
  }
  return inbreeding
}

export default async function (): Promise<void> {
  const calls = 1_000_000
  timePerCall('heterozygosityRetained (Ne 10..1000, t = 50)', calls, i => heterozygosityRetained({ effectiveSize: 10 + (i % 991), generations: 50 }))
  timePerCall('relativeFitness', calls, i => relativeFitness({ diploidLethalEquivalents: 6, inbreeding: (i % 100) / 100 }))
  timePerCall('effectiveSizeForInbreedingTarget', calls, i => effectiveSizeForInbreedingTarget({ maxInbreeding: 0.01 + (i % 90) / 100, generations: 10 }))
  for (const generations of [10, 100, 1000, 10_000]) {
    const n = Math.max(1000, Math.floor(2_000_000 / generations))
    const closed = timePerCall(`inbreedingAfter, closed form, t = ${generations}`, n, i => inbreedingAfter({ effectiveSize: 50 + (i % 7), generations, migrationRate: 0.01 }))
    const loop = timePerCall(`literal recurrence loop, t = ${generations}`, n, i => literalIteration(50 + (i % 7), generations, 0, 0.01))
    console.log(`  ratio loop / closed form at t = ${generations}: ${(loop / closed).toFixed(1)}×`)
  }
  const runs = 2000
  const start = performance.now()
  let length = 0
  for (let i = 0; i < runs; i++) length += inbreedingTrajectory({ effectiveSize: 50, generations: 1000, initialInbreeding: 0.2, migrationRate: 0.02 }).length
  console.log(`${'inbreedingTrajectory, 1001 points'.padEnd(58)} ${(((performance.now() - start) * 1e3) / runs).toFixed(1).padStart(10)} µs/call  (${length / runs} points)`)
}
