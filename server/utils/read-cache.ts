/**
 * Answers to frequent reads, remembered per process and never handed out once the records have
 * changed.
 *
 * Every change to the records moves one version number (migration 0009-data-version, a trigger
 * at commit time), and `requireUser` reads that version in the same query as the user, before
 * the route reads anything else. An answer is remembered under the version read before it was
 * built, so it is at least as new as that version; it is given out again only to a request that
 * read the same version, i.e. when nothing has been committed since. Any write anywhere, by this
 * process, another one or another machine, makes every remembered answer stale at once.
 *
 * Keys must name everything the answer depends on besides the records (agency, ids, query);
 * the route's own checks (role, agency scope) run inside `read`, so a refused request throws and
 * nothing is remembered. Remembered answers are deep-frozen: nobody can change one in place.
 * Bounded by size (READ_CACHE_MAX_BYTES of JSON per process, least recently used first out).
 */
import type { H3Event } from 'h3'
import { LRUCache } from 'lru-cache'
import { deepFreeze } from './deep-freeze'

/** Most JSON text remembered per process (64 MB). */
export const READ_CACHE_MAX_BYTES = 64 * 1024 * 1024

interface Remembered { version: string, value: unknown }

const remembered = new LRUCache<string, Remembered>({ maxSize: READ_CACHE_MAX_BYTES })

/**
 * The answer of `read`, or the one remembered under `key` when no record has changed since.
 * Without a version on the event (requireUser not called) it simply reads.
 *
 * @param event - the request; `requireUser(event)` must have run (it sets the version)
 * @param key - everything besides the records that the answer depends on, e.g. `proposal:${agencyId}:${id}`
 * @param read - builds the answer (JSON-serialisable; throws to refuse, nothing is then remembered)
 */
export async function rememberedRead<T>(event: H3Event, key: string, read: () => Promise<T>): Promise<T> {
  const version = event.context.dataVersion as string | undefined
  if (version === undefined) return await read()
  const known = remembered.get(key)
  if (known && known.version === version) return known.value as T
  const value = await read()
  const size = Buffer.byteLength(JSON.stringify(value) ?? '')
  if (size > 0 && size <= READ_CACHE_MAX_BYTES / 8) remembered.set(key, { version, value: deepFreeze(value) }, { size })
  return value
}

/** Forgets everything (tests). */
export function forgetRememberedReads(): void {
  remembered.clear()
}
