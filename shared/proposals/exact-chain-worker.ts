/**
 * Web-worker entry: computes the exact chain's fixation vector off the page's main thread
 * (composables/useProposalExactChains.ts starts it with `new Worker(new URL(...))`).
 *
 * Message in: { key, census, s, h }. Message out: { key, vector } (the Float64Array's buffer is
 * transferred) or { key, error } with the engine's message.
 */
import { exactFixationProbabilities } from '../genetics/exact'

interface ExactChainRequest { key: string, census: number, s: number, h: number }

const scope = globalThis as unknown as {
  onmessage: ((event: { data: ExactChainRequest }) => void) | null
  postMessage: (message: unknown, transfer?: ArrayBuffer[]) => void
}

scope.onmessage = (event) => {
  const { key, census, s, h } = event.data
  try {
    const vector = exactFixationProbabilities({ census, s, h })
    scope.postMessage({ key, vector }, [vector.buffer as ArrayBuffer])
  } catch (error) {
    scope.postMessage({ key, error: error instanceof Error ? error.message : String(error) })
  }
}
