/**
 * The exact Wright–Fisher chain's fixation vector, remembered per (census, s, h).
 *
 * Why: one chain at census 2000 takes about half a second of one core, during which the process
 * answers nobody else; the vector is a pure function of (census, s, h), and API users (and the
 * load script) ask for the same few chains again and again. Entries are the engine's own
 * Float64Array, handed out read-only by convention (callers index it, never write to it).
 */
import { exactFixationProbabilities } from '#shared/genetics'
import type { ExactVectorProvider } from '#shared/proposals/exact-start'

/** Most chains remembered (a census-2000 vector is 32 kB). */
export const EXACT_CHAIN_MEMO_SIZE = 256

const vectors = new Map<string, Float64Array | null>()

/**
 * `computeExactVector` with memory: the same (census, s, h) computes once per process.
 *
 * @param chain - census (integer ≥ 1), s (1 + s > 0), h
 * @returns the fixation probability from each start count 0…2·census (engine errors are thrown, not remembered)
 */
export const rememberedExactVector: ExactVectorProvider = (chain) => {
  const key = `${chain.census}|${chain.s}|${chain.h}`
  const known = vectors.get(key)
  if (known !== undefined) {
    // Refresh its place: the least recently used entry is the one forgotten.
    vectors.delete(key)
    vectors.set(key, known)
    return known
  }
  const vector = exactFixationProbabilities(chain)
  if (vectors.size >= EXACT_CHAIN_MEMO_SIZE) {
    const oldest = vectors.keys().next().value
    if (oldest !== undefined) vectors.delete(oldest)
  }
  vectors.set(key, vector)
  return vector
}
