/**
 * Speed of the proposal workspace's live results (shared/proposals): one
 * `computeScenarioResults` call is what the page runs after each (debounced) input change.
 * Bar: 50 ms per update (issue 6). The exact chain is timed separately: the page computes
 * chains with round(Ne) > 150 in a worker and caches every vector by (round(Ne), s, h), so an
 * update pays for a chain only when Ne, s or h changed.
 *
 * Figures are the median wall time of several runs after a warm-up, single thread, Node.
 */
import { exactFixationProbabilities } from '../shared/genetics'
import { computeScenarioResults } from '../shared/proposals/results'
import { establishmentHeatmap, tornado } from '../shared/proposals/sensitivity'
import type { RecipientFigures, ScenarioInputsLike } from '../shared/proposals/types'

const BAR_MS = 50

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.floor(sorted.length / 2)] ?? Number.NaN
}

function time(run: () => void, repeats: number): number {
  run()
  const samples: number[] = []
  for (let index = 0; index < repeats; index++) {
    const start = performance.now()
    run()
    samples.push(performance.now() - start)
  }
  return median(samples)
}

const variant = { name: 'v', sourceFrequency: 0.5, s: 0.05, sRange: [0.01, 0.1] as const, h: 0.5, hRange: [0.1, 0.9] as const }
const load = { diploidLethalEquivalents: 12, range: [3.1, 30.3] as const, citation: 'wildMammalsAndBirdsLifeHistory' }

function scenario(animals: number, events: number, variants: number, h: number, horizonYears = 50): ScenarioInputsLike {
  return {
    schedule: { animalsPerEvent: animals, females: Math.ceil(animals / 2), males: Math.floor(animals / 2), intervalYears: 5, events, firstEventYear: 0 },
    variants: Array.from({ length: variants }, (_, index) => ({ ...variant, name: `v${index}`, h })),
    load,
    horizonYears,
  }
}

export default async function (): Promise<void> {
  const cases: { label: string, recipient: RecipientFigures, inputs: ScenarioInputsLike }[] = [
    { label: 'default scenario (4 animals × 3 releases, 1 variant), N = 66, Ne = 12', recipient: { census: 66, effectiveSize: 12, generationTimeYears: 2.2, initialInbreeding: 0 }, inputs: scenario(4, 3, 1, 0.5) },
    { label: 'default scenario, N = 1627, Ne = 346', recipient: { census: 1627, effectiveSize: 346, generationTimeYears: 3, initialInbreeding: 0 }, inputs: scenario(4, 3, 1, 0.5) },
    { label: '5 variants (h = 0.3), 20 animals × 10 releases, N = 400, Ne = 80', recipient: { census: 400, effectiveSize: 80, generationTimeYears: 3, initialInbreeding: 0 }, inputs: scenario(20, 10, 5, 0.3) },
    { label: 'worst case: 5 variants, 500 animals × 50 releases, N = 1627, Ne = 346', recipient: { census: 1627, effectiveSize: 346, generationTimeYears: 3, initialInbreeding: 0 }, inputs: scenario(500, 50, 5, 0.3) },
    { label: 'long horizon: 500 years at L = 1 (500 generations)', recipient: { census: 400, effectiveSize: 80, generationTimeYears: 1, initialInbreeding: 0 }, inputs: scenario(4, 3, 1, 0.5, 500) },
  ]
  console.log(`computeScenarioResults per update, exact chain vector cached (bar ${BAR_MS} ms):`)
  for (const item of cases) {
    const vectors = new Map<string, Float64Array>()
    const cached = (chain: { census: number, s: number, h: number }) => {
      const key = `${chain.census}|${chain.s}|${chain.h}`
      let vector = vectors.get(key)
      if (!vector) {
        vector = exactFixationProbabilities(chain)
        vectors.set(key, vector)
      }
      return vector
    }
    const ms = time(() => computeScenarioResults({ recipient: item.recipient, inputs: item.inputs }, { exactVector: cached }), 7)
    console.log(`  ${item.label}: ${ms.toFixed(2)} ms (${(ms / BAR_MS).toFixed(2)} × bar)`)
  }
  console.log('exact chain vector (paid once per round(Ne), s, h):')
  for (const census of [12, 80, 150, 346, 1000, 2000]) {
    const ms = time(() => exactFixationProbabilities({ census, s: 0.05, h: 0.5 }), census > 1000 ? 1 : 3)
    console.log(`  round(Ne) = ${census}: ${ms.toFixed(1)} ms${census <= 150 ? ' (computed in the page)' : ' (computed in a worker)'}`)
  }
  const recipient = { census: 400, effectiveSize: 80, generationTimeYears: 3, initialInbreeding: 0 }
  const inputs = scenario(4, 3, 1, 0.5)
  console.log('sensitivity view (compare page, not per keystroke):')
  console.log(`  tornado, establishment: ${time(() => tornado('establishment', { recipient, inputs }), 5).toFixed(2)} ms`)
  console.log(`  tornado, fitness: ${time(() => tornado('fitness', { recipient, inputs }), 5).toFixed(2)} ms`)
  console.log(`  heat map 11 × 9: ${time(() => establishmentHeatmap({ recipient, inputs }), 3).toFixed(2)} ms`)
}
