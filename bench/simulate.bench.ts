/**
 * Speed of the stochastic simulations (issue 4):
 * 1. one-locus allele-frequency model, N = Ne = 1000: replicate-generations
 *    per second on one core, and the ratio to a vectorised numpy version of
 *    the same model (bench/numpy_allele_frequency.py) when python3 + numpy
 *    exist (bar: ≥ 2×);
 * 2. individual-based model, N = 500, 2000 load + 200 marker loci, 100
 *    generations: time per replicate on one core and the projected time of
 *    200 replicates on one and two cores (target ≤ 60 s on 2 cores), with the
 *    burn-in reported separately;
 * 3. how that time grows with N, loci and replicates on smaller runs.
 * CPU time (process.cpuUsage) is printed next to wall time because a shared
 * machine can make wall time meaningless. Each figure is the best of
 * several runs after a warm-up of the same size: on a shared virtual machine
 * single runs of the same code differ by 20–40 %, and CPU time also counts
 * the compiler threads of a cold start.
 */
import { spawnSync } from 'node:child_process'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { runEstablishmentReplicates } from '../shared/genetics/simulate/establishment'
import type { EstablishmentParams } from '../shared/genetics/simulate/establishment'
import { runRescueReplicates } from '../shared/genetics/simulate/rescue'
import { genomeArchitecture } from '../shared/genetics/simulate/rescue/architecture'
import { burnIn } from '../shared/genetics/simulate/rescue/burn-in'
import { rescuePlan } from '../shared/genetics/simulate/rescue/rescue-plan'
import { replicateStream, sharedStream, spawnStream } from '../shared/genetics/simulate/random'
import type { RescueParams } from '../shared/genetics/simulate/rescue'
import { quantileOfSorted } from '../shared/genetics/simulate/summary/quantiles'

const here = dirname(fileURLToPath(import.meta.url))

interface Timing { wall: number, cpu: number }

/** Best (least CPU) of several runs, and the median CPU of the same runs. */
interface RunTimings extends Timing { medianCpu: number }

function timed(action: () => void): Timing {
  const cpuStart = process.cpuUsage()
  const wallStart = performance.now()
  action()
  const cpu = process.cpuUsage(cpuStart)
  return { wall: (performance.now() - wallStart) / 1000, cpu: (cpu.user + cpu.system) / 1e6 }
}

const format = (value: number, digits = 2): string => value.toFixed(digits)

/** What bench/numpy_allele_frequency.py prints. */
interface NumpyRun { replicate_generations: number, seconds: number, cpu_seconds: number, rate: number, cpu_rate: number }

/** Timed runs per figure (the best is kept), for both sides of a comparison. */
const RUNS = 5

/** N = Ne of the allele-frequency model timed here. */
const ALLELE_FREQUENCY_BENCH_CENSUS = 1000

/** The allele-frequency model timed here, also used by bench/compare-with-revision.ts. */
export const ALLELE_FREQUENCY_BENCH_PARAMS: EstablishmentParams = {
  census: ALLELE_FREQUENCY_BENCH_CENSUS, effectiveSize: ALLELE_FREQUENCY_BENCH_CENSUS, s: 0.01, h: 0.5, sourceFrequency: 0.5, migrantsPerEvent: 10, eventInterval: 1, events: 1, generations: 10_000,
}

/** Replicates per timed allele-frequency run. */
export const ALLELE_FREQUENCY_BENCH_REPLICATES = 20_000

function alleleFrequencyBenchmark(): void {
  const params = ALLELE_FREQUENCY_BENCH_PARAMS
  const census = ALLELE_FREQUENCY_BENCH_CENSUS
  const replicates = ALLELE_FREQUENCY_BENCH_REPLICATES
  console.log(`Allele-frequency model: N = Ne = ${census}, s = ${params.s}, h = ${params.h}, one event of ${params.migrantsPerEvent} animals at q = ${params.sourceFrequency}, horizon ${params.generations}, ${replicates} replicates`)
  runEstablishmentReplicates(params, { seed: 1, firstReplicate: 0, replicates: 2000 }) // warm-up (JIT)
  const script = join(here, 'numpy_allele_frequency.py')
  const args = [script, String(census), String(census), String(params.s), String(params.h), String(params.migrantsPerEvent), String(params.sourceFrequency), String(params.generations), String(replicates), '1']
  // TypeScript and numpy take turns, so that both sides of each pair meet the same state of a
  // shared machine (whose speed drifts by 20–40 % over minutes); the best of each side is kept.
  let work = 0
  let best: Timing = { wall: Infinity, cpu: Infinity }
  const numpyRuns: NumpyRun[] = []
  const pairRatios: number[] = []
  let numpyMissing = ''
  for (let run = 0; run < RUNS; run++) {
    let partial = runEstablishmentReplicates(params, { seed: 1, firstReplicate: 0, replicates: 1 })
    const timing = timed(() => {
      partial = runEstablishmentReplicates(params, { seed: 1, firstReplicate: 0, replicates })
    })
    work = partial.unresolved * params.generations
    for (const time of partial.establishmentTimes) work += time
    for (const time of partial.lossTimes) work += time
    if (timing.cpu < best.cpu) best = timing
    if (numpyMissing) continue
    const result = spawnSync('python3', args, { encoding: 'utf8' })
    if (result.status !== 0) {
      numpyMissing = (result.stderr || String(result.error ?? '')).trim().split('\n').pop() ?? 'unknown error'
      continue
    }
    const numpyRun = JSON.parse(result.stdout) as NumpyRun
    numpyRuns.push(numpyRun)
    pairRatios.push(work / timing.cpu / numpyRun.cpu_rate)
  }
  const cpuRate = work / best.cpu
  console.log(`  TypeScript: ${work} replicate-generations, best of ${RUNS}: wall ${format(best.wall)} s, CPU ${format(best.cpu)} s → ${format(work / best.wall / 1e6)} M/s wall, ${format(cpuRate / 1e6)} M/s CPU (one core)`)
  if (numpyMissing) {
    console.log(`  numpy comparison skipped (python3 with numpy not available: ${numpyMissing})`)
    return
  }
  const numpy = numpyRuns.reduce((a, b) => (b.cpu_seconds < a.cpu_seconds ? b : a))
  console.log(`  numpy (vectorised, finished replicates dropped): ${numpy.replicate_generations} replicate-generations, best of ${RUNS}: wall ${format(numpy.seconds)} s, CPU ${format(numpy.cpu_seconds)} s → ${format(numpy.rate / 1e6)} M/s wall, ${format(numpy.cpu_rate / 1e6)} M/s CPU`)
  const ratio = cpuRate / numpy.cpu_rate
  const median = quantileOfSorted(Float64Array.from(pairRatios).sort(), 0.5) ?? Number.NaN
  console.log(`  ratio TypeScript / numpy (CPU rates): ${format(ratio)}× best against best (bar ≥ 2×: ${ratio >= 2 ? 'met' : 'NOT met'}); per pair ${pairRatios.map(value => format(value)).join(' ')}, median ${format(median)}×`)
}

/** The individual-based model timed here at the given sizes (also used by bench/compare-with-revision.ts). */
export function rescueParams(census: number, loadLoci: number, markerLoci: number, generations: number, burnInGenerations: number): RescueParams {
  return {
    recipient: { census, effectiveRatio: 1, burnInGenerations },
    source: { census, effectiveRatio: 1, burnInGenerations },
    generations,
    markerLoci,
    load: { loci: loadLoci },
    adaptive: { s: 0.1, h: 0.5, sourceFrequency: 0.5 },
    translocation: { migrantsPerEvent: 5, eventInterval: 10, events: 10 },
  }
}

function perReplicate(params: RescueParams, replicates: number, runs = 1): RunTimings {
  let best: Timing = { wall: Infinity, cpu: Infinity }
  const cpu: number[] = []
  for (let run = 0; run < runs; run++) {
    const timing = timed(() => {
      runRescueReplicates(params, { seed: 7, firstReplicate: 0, replicates })
    })
    cpu.push(timing.cpu)
    if (timing.cpu < best.cpu) best = timing
  }
  const medianCpu = quantileOfSorted(Float64Array.from(cpu).sort(), 0.5) ?? Number.NaN
  return { wall: best.wall / replicates, cpu: best.cpu / replicates, medianCpu: medianCpu / replicates }
}

/** CPU seconds per generation of one population's burn-in (N = census, the bench's genome), best of `runs` runs. */
function burnInSeconds(census: number, generations: number, runs: number): number {
  const plan = rescuePlan('bench', rescueParams(census, 2000, 200, 100, generations))
  const architecture = genomeArchitecture(plan, sharedStream(7))
  burnIn(plan.recipient, architecture, spawnStream(replicateStream(7, 0))) // warm-up
  let best = Infinity
  for (let run = 1; run <= runs; run++) {
    best = Math.min(best, timed(() => burnIn(plan.recipient, architecture, spawnStream(replicateStream(7, run)))).cpu)
  }
  return best / generations
}

function rescueBenchmark(): void {
  const census = 500
  const replicates = 200
  console.log(`\nIndividual-based model: N = ${census} (recipient and source), 2000 load + 200 marker loci, 100 generations, events of 5 animals every 10 generations, paired arms`)
  runRescueReplicates(rescueParams(100, 500, 64, 10, 10), { seed: 1, firstReplicate: 0, replicates: 2 }) // warm-up (JIT)
  const sample = 2
  // Five runs: on this kind of shared VM one run of the same code can take 1.6× another.
  const runs = 5
  perReplicate(rescueParams(census, 2000, 200, 100, 0), 1) // warm-up at full size (JIT)
  const phase = perReplicate(rescueParams(census, 2000, 200, 100, 0), sample, runs)
  console.log(`  translocation phase only (no burn-in), best of ${runs} runs of ${sample} replicates: ${format(phase.cpu)} s CPU (${format(phase.wall)} s wall) per replicate; median run ${format(phase.medianCpu)} s CPU`)
  console.log(`    200 replicates: one core ${format(phase.cpu * replicates, 0)} s CPU; projected on 2 cores ${format(phase.cpu * replicates / 2, 0)} s (target ≤ 60 s: ${phase.cpu * replicates / 2 <= 60 ? 'met' : 'NOT met'}; from the median run ${format(phase.medianCpu * replicates / 2, 0)} s)`)
  const burnInCost = burnInSeconds(census, 100, runs)
  console.log(`  burn-in: ${format(burnInCost * 1000)} ms CPU per population-generation, best of ${runs} runs of 100 generations (both populations are burned in)`)
  for (const generations of [100, 200, 2000]) {
    const total = phase.cpu + burnInCost * 2 * generations
    console.log(`    with a ${generations}-generation burn-in: ${format(total)} s CPU per replicate → 200 replicates ≈ ${format(total * replicates / 2, 0)} s on 2 cores`)
  }
}

function scalingBenchmark(): void {
  console.log('\nScaling of the individual-based model (phase only, CPU seconds per replicate, best of 3 runs, unless noted):')
  const base = { census: 200, load: 1000, markers: 200, generations: 50 }
  const rows: string[] = []
  perReplicate(rescueParams(100, base.load, base.markers, base.generations, 0), 2) // warm-up at the first size (JIT)
  for (const census of [100, 200, 400]) {
    const timing = perReplicate(rescueParams(census, base.load, base.markers, base.generations, 0), 2, 3)
    rows.push(`  N = ${census} (loci ${base.load} + ${base.markers}, ${base.generations} generations): ${format(timing.cpu, 3)} s`)
  }
  for (const loci of [500, 2000, 8000]) {
    const timing = perReplicate(rescueParams(base.census, loci, base.markers, base.generations, 0), 2, 3)
    rows.push(`  load loci = ${loci} (N ${base.census}): ${format(timing.cpu, 3)} s`)
  }
  for (const replicates of [2, 4, 8]) {
    const timing = timed(() => {
      runRescueReplicates(rescueParams(base.census, base.load, base.markers, base.generations, 0), { seed: 3, firstReplicate: 0, replicates })
    })
    rows.push(`  ${replicates} replicates (N ${base.census}, loci ${base.load}): ${format(timing.cpu, 3)} s CPU in total`)
  }
  for (const row of rows) console.log(row)
  console.log('  (expected: about linear in loci and replicates; between linear and quadratic in N — the pedigree kinship matrix is N²)')
}

export default async function (): Promise<void> {
  alleleFrequencyBenchmark()
  rescueBenchmark()
  scalingBenchmark()
}
