/**
 * Throughput of the diffusion fixation probability on one core.
 *
 * Grid (SCIENCE.md §1.6): N ∈ {10, 50, 100, 1000, 10000} × Ne/N ∈ {1, 0.5, 0.1}
 * × s ∈ {−0.01, 0.001, 0.01, 0.1, 0.5} × h ∈ {0, ¼, ½, 1} × k ∈ {1, 5, 20}
 * (900 mixed inputs). The reference figure is 33,000 evaluations per second
 * for scipy `quad` on the same integral, as stated in the issue; the bar is
 * 10× that (300,000/s). Run: `npx tsx bench/run.ts fixation`.
 */
import { conditionalFixationTime, fixationProbability } from '../shared/genetics/fixation'
import type { FixationInputs } from '../shared/genetics/fixation'

const REFERENCE_PER_SECOND = 33_000
const BAR_PER_SECOND = 300_000
const SECONDS_PER_ROUND = 1
const ROUNDS = 5

function grid(): FixationInputs[] {
  const inputs: FixationInputs[] = []
  for (const census of [10, 50, 100, 1000, 10000]) {
    for (const ratio of [1, 0.5, 0.1]) {
      for (const s of [-0.01, 0.001, 0.01, 0.1, 0.5]) {
        for (const h of [0, 0.25, 0.5, 1]) {
          for (const copies of [1, 5, 20]) inputs.push({ census, effectiveSize: census * ratio, s, h, copies })
        }
      }
    }
  }
  return inputs
}

/** Evaluations per second of `evaluate` over `inputs`, best of several rounds. */
function throughput(inputs: readonly FixationInputs[], evaluate: (input: FixationInputs) => number, seconds: number): number {
  let best = 0
  let checksum = 0
  for (let round = 0; round < ROUNDS; round++) {
    const start = performance.now()
    let count = 0
    while (performance.now() - start < seconds * 1000) {
      for (const input of inputs) checksum += evaluate(input)
      count += inputs.length
    }
    best = Math.max(best, count / ((performance.now() - start) / 1000))
  }
  if (!Number.isFinite(checksum)) throw new Error('non-finite result in benchmark')
  return best
}

function format(perSecond: number): string {
  return Math.round(perSecond).toLocaleString('en-US')
}

export default async function (): Promise<void> {
  const inputs = grid()
  // Warm-up so that the JIT has compiled the hot paths before timing.
  for (let pass = 0; pass < 20; pass++) for (const input of inputs) fixationProbability(input)

  const perSecond = throughput(inputs, fixationProbability, SECONDS_PER_ROUND)
  const ratio = perSecond / REFERENCE_PER_SECOND
  console.log(`fixationProbability, ${inputs.length}-point mixed grid, one core: ${format(perSecond)} evaluations/s`)
  console.log(`  ratio to the scipy quad reference (${format(REFERENCE_PER_SECOND)}/s): ${ratio.toFixed(1)}×`)
  console.log(`  bar ${format(BAR_PER_SECOND)}/s (10×): ${perSecond >= BAR_PER_SECOND ? 'PASS' : 'FAIL'}`)

  for (const h of [0, 0.25, 0.5, 1]) {
    const subset = inputs.filter(input => input.h === h)
    console.log(`  h = ${h}: ${format(throughput(subset, fixationProbability, SECONDS_PER_ROUND / 4))} evaluations/s`)
  }

  // Conditional fixation time (nested quadrature) for information only: no bar.
  const timeInputs = inputs.filter(input => input.copies < 2 * input.census)
  const timeStart = performance.now()
  for (const input of timeInputs) conditionalFixationTime(input)
  const timeSeconds = (performance.now() - timeStart) / 1000
  console.log(`conditionalFixationTime, same grid: ${format(timeInputs.length / timeSeconds)} evaluations/s (information only)`)
}
