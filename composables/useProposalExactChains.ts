/**
 * The exact Wright–Fisher chain's fixation vectors for the proposal pages, cached by
 * (round(Ne), s, h). Small chains (round(Ne) ≤ 150, a few milliseconds) are solved on the spot;
 * larger ones (up to 2000, up to about a second) in a web worker, one at a time, newest request
 * first — the results show "computing…" for the exact figure meanwhile and `revision` ticks
 * when a vector arrives, so the page recomputes (cheaply) with it.
 *
 * Use one per page; the worker is stopped when the page's scope ends.
 */
import { exactFixationProbabilities } from '#shared/genetics'
import type { ExactVectorProvider } from '#shared/proposals'

/** Largest round(Ne) solved on the main thread (bench/proposal-results.bench.ts: ≈ 3 ms). */
export const EXACT_CHAIN_SYNC_LIMIT = 150
const CACHE_SIZE = 48

interface ChainKey { census: number, s: number, h: number }

export function useProposalExactChains() {
  const cache = new Map<string, Float64Array>()
  const failed = new Map<string, string>()
  const wanted = new Map<string, ChainKey>()
  const revision = ref(0)
  const busy = ref(false)
  let worker: Worker | null = null
  let running: string | null = null

  const keyOf = (chain: ChainKey) => `${chain.census}|${chain.s}|${chain.h}`

  function remember(key: string, vector: Float64Array): void {
    cache.set(key, vector)
    if (cache.size > CACHE_SIZE) {
      const oldest = cache.keys().next().value
      if (oldest !== undefined) cache.delete(oldest)
    }
  }

  function startWorker(): Worker | null {
    if (worker || typeof Worker === 'undefined') return worker
    try {
      worker = new Worker(new URL('../shared/proposals/exact-chain-worker.ts', import.meta.url), { type: 'module' })
    } catch {
      worker = null
      return null
    }
    worker.onmessage = (event: MessageEvent<{ key: string, vector?: Float64Array, error?: string }>) => {
      const { key, vector, error } = event.data
      if (vector) remember(key, vector)
      else failed.set(key, error ?? 'The exact chain could not be computed.')
      wanted.delete(key)
      running = null
      revision.value++
      next()
    }
    worker.onerror = () => {
      // Fall back to the main thread for whatever is still wanted.
      worker?.terminate()
      worker = null
      running = null
      next()
    }
    return worker
  }

  function next(): void {
    if (running) return
    const entries = [...wanted.entries()].filter(([key]) => !cache.has(key) && !failed.has(key))
    const newest = entries[entries.length - 1]
    busy.value = Boolean(newest)
    if (!newest) return
    const [key, chain] = newest
    const target = startWorker()
    if (target) {
      running = key
      target.postMessage({ key, ...chain })
      return
    }
    // No worker (old browser or blocked): compute after the current frame.
    running = key
    setTimeout(() => {
      try {
        remember(key, exactFixationProbabilities(chain))
      } catch (error) {
        failed.set(key, error instanceof Error ? error.message : String(error))
      }
      wanted.delete(key)
      running = null
      revision.value++
      next()
    }, 0)
  }

  /** Marks the start of a computing pass: requests from earlier passes are no longer wanted. */
  function beginPass(): void {
    for (const key of [...wanted.keys()]) if (key !== running) wanted.delete(key)
  }

  /** The provider handed to computeScenarioResults. */
  const provider: ExactVectorProvider = (chain) => {
    const key = keyOf(chain)
    const hit = cache.get(key)
    if (hit) return hit
    if (failed.has(key)) return null
    if (chain.census <= EXACT_CHAIN_SYNC_LIMIT || !import.meta.client) {
      const vector = exactFixationProbabilities(chain)
      remember(key, vector)
      return vector
    }
    wanted.delete(key)
    wanted.set(key, chain)
    queueMicrotask(next)
    return null
  }

  onScopeDispose(() => {
    worker?.terminate()
    worker = null
  })

  return { provider, beginPass, revision, busy }
}
