/**
 * `npm run bench:compare -- <git revision>`: how much faster (or slower) the simulation engine
 * of this checkout is than the engine of an earlier revision, measured in one process by
 * alternating the two on the same work.
 *
 * Why: on a shared virtual machine the same code measures 20–40 % apart from one run to the
 * next (and up to 2× for the individual-based model), so comparing figures printed by two
 * separate `npm run bench` runs says little. Running old and new in turn, pair after pair, in
 * one process puts both under the same conditions, and the pairs of one run agree to about
 * ±10 %. Between runs, and between harnesses that warm up or load modules differently, the
 * overall ratio still moves by 10–20 % (the JIT's choices depend on what the process has run),
 * so repeat it and treat smaller differences as noise.
 *
 * The revision's files are checked out with `git worktree` into a temporary folder (sharing
 * this checkout's node_modules; bench/revision-checkout.ts) and removed afterwards. The models are bench/simulate.bench.ts's:
 * allele-frequency (N = Ne = 1000, 20 000 replicates per run) and individual-based
 * (N = 500, 2000 load + 200 marker loci, 100 generations, one replicate per run).
 * Prints CPU seconds per pair and the ratio old / new (> 1: this checkout is faster), overall
 * (ratio of the sums) and for the median pair. TRIBUTARY_COMPARE_PAIRS sets the number of pairs
 * (default 8).
 */
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import type { runEstablishmentReplicates as RunEstablishment } from '../shared/genetics/simulate/establishment'
import type { runRescueReplicates as RunRescue } from '../shared/genetics/simulate/rescue'
import { quantileOfSorted } from '../shared/genetics/simulate/summary/quantiles'
import { checkoutRoot, withRevisionCheckout } from './revision-checkout'
import { ALLELE_FREQUENCY_BENCH_PARAMS, ALLELE_FREQUENCY_BENCH_REPLICATES, rescueParams } from './simulate.bench'
/** Alternating pairs per model (TRIBUTARY_COMPARE_PAIRS overrides). */
const PAIRS = Math.max(1, Number(process.env.TRIBUTARY_COMPARE_PAIRS) || 8)

interface Engines { establishment: typeof RunEstablishment, rescue: typeof RunRescue }

async function enginesAt(folder: string): Promise<Engines> {
  const establishment = await import(pathToFileURL(join(folder, 'shared/genetics/simulate/establishment/index.ts')).href) as { runEstablishmentReplicates: typeof RunEstablishment }
  const rescue = await import(pathToFileURL(join(folder, 'shared/genetics/simulate/rescue/index.ts')).href) as { runRescueReplicates: typeof RunRescue }
  return { establishment: establishment.runEstablishmentReplicates, rescue: rescue.runRescueReplicates }
}

function cpuSeconds(action: () => void): number {
  const start = process.cpuUsage()
  action()
  const used = process.cpuUsage(start)
  return (used.user + used.system) / 1e6
}

/** Runs `old` and `current` in turn PAIRS times after one warm-up each; prints the pairs and the ratio of the sums. */
function comparePaired(name: string, old: () => void, current: () => void): void {
  old()
  current()
  let oldTotal = 0
  let currentTotal = 0
  const ratios: number[] = []
  for (let pair = 0; pair < PAIRS; pair++) {
    const oldTime = cpuSeconds(old)
    const currentTime = cpuSeconds(current)
    oldTotal += oldTime
    currentTotal += currentTime
    ratios.push(oldTime / currentTime)
  }
  // The median pair is less moved than the sums by a run that another tenant of the machine slowed down.
  const median = quantileOfSorted(Float64Array.from(ratios).sort(), 0.5) ?? Number.NaN
  console.log(`${name}: old ${(oldTotal / PAIRS).toFixed(3)} s, this checkout ${(currentTotal / PAIRS).toFixed(3)} s CPU per run; old / new per pair ${ratios.map(ratio => ratio.toFixed(2)).join(' ')}; overall ${(oldTotal / currentTotal).toFixed(3)}×, median pair ${median.toFixed(3)}×`)
}

async function main(): Promise<void> {
  const revision = process.argv[2]
  if (!revision) throw new Error('Name the revision to compare with, e.g. npm run bench:compare -- HEAD~3')
  await withRevisionCheckout(revision, async (worktree) => {
    const old = await enginesAt(worktree)
    const current = await enginesAt(checkoutRoot)
    console.log(`Comparing the simulation engine of this checkout with ${revision} (${PAIRS} alternating pairs per model, CPU time)`)
    const frequency = ALLELE_FREQUENCY_BENCH_PARAMS
    const block = { seed: 1, firstReplicate: 0, replicates: ALLELE_FREQUENCY_BENCH_REPLICATES }
    comparePaired('allele-frequency model', () => old.establishment(frequency, block), () => current.establishment(frequency, block))
    const rescue = rescueParams(500, 2000, 200, 100, 0)
    let replicate = 0
    comparePaired('individual-based model', () => old.rescue(rescue, { seed: 7, firstReplicate: replicate, replicates: 1 }), () => current.rescue(rescue, { seed: 7, firstReplicate: replicate++, replicates: 1 }))
  })
}

await main()
