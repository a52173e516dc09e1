/**
 * Answers to frequent reads, remembered per process and never handed out once the records they
 * were built from have changed.
 *
 * Every change to a table moves that table's version (migration 0009-data-version, a trigger at
 * commit time), and `requireUser` reads the versions in the same query as the user, before the
 * route reads anything else. An answer is remembered under the versions of the tables it reads,
 * as they were before it was built, so it is at least as new as them; it is given out again only
 * to a request that read the same versions, i.e. when none of those tables has had a commit
 * since. A write anywhere — this process, another one, another machine, psql — makes every
 * remembered answer that reads the written table stale at once.
 *
 * Requests that read the same versions while an answer for their key is being built wait for
 * that build instead of starting their own (after a write, a hundred waiting readers cost one
 * build, not a hundred). This is as safe as the remembered answers: the build reads records at
 * least as new as the versions, and each waiting request read those same versions after it
 * arrived.
 *
 * Callers name every table the answer reads (`tables`) and, in `key`, everything else it depends
 * on (agency, ids, query). A table left out of `tables` would let an old answer out: list them
 * all, including those read only for a check. The route's own checks (role, agency scope) run
 * inside `read`, so a refused request throws and nothing is remembered. Remembered answers are
 * deep-frozen: nobody can change one in place. Bounded by size (READ_CACHE_MAX_BYTES of JSON per
 * process, least recently used first out).
 */
import type { H3Event } from 'h3'
import { LRUCache } from 'lru-cache'
import type { VersionedTable } from '../db/versioned-tables'
import { deepFreeze } from './deep-freeze'

/** Most JSON text remembered per process (64 MB). */
export const READ_CACHE_MAX_BYTES = 64 * 1024 * 1024

interface Remembered { version: string, value: unknown }

const remembered = new LRUCache<string, Remembered>({ maxSize: READ_CACHE_MAX_BYTES })

/** Answers being built, so requests that read the same versions wait for one build, not each their own. */
const inFlight = new Map<string, { version: string, answer: Promise<unknown> }>()

/** The versions of `tables` as one string, or undefined when the request read none (no requireUser). */
function versionOf(event: H3Event, tables: readonly VersionedTable[]): string | undefined {
  const versions = event.context.dataVersions as Readonly<Record<string, number>> | undefined
  if (!versions) return undefined
  return tables.map(table => versions[table] ?? 'none').join('.')
}

/**
 * The answer of `read`, or the one remembered under `key` when none of `tables` has changed
 * since. Without versions on the event (requireUser not called) it simply reads.
 *
 * @param event - the request; `requireUser(event)` must have run (it reads the versions)
 * @param key - everything besides the records that the answer depends on, e.g. `proposal:${agencyId}:${id}`
 * @param tables - every table `read` reads
 * @param read - builds the answer (JSON-serialisable; throws to refuse, nothing is then remembered)
 */
export async function rememberedRead<T>(event: H3Event, key: string, tables: readonly VersionedTable[], read: () => Promise<T>): Promise<T> {
  const version = versionOf(event, tables)
  if (version === undefined) return await read()
  const known = remembered.get(key)
  if (known && known.version === version) return known.value as T
  const flight = inFlight.get(key)
  if (flight && flight.version === version) return await flight.answer as T
  const answer = read().then((value) => {
    const size = Buffer.byteLength(JSON.stringify(value) ?? '')
    if (size > 0 && size <= READ_CACHE_MAX_BYTES / 8) remembered.set(key, { version, value: deepFreeze(value) }, { size })
    return value
  })
  inFlight.set(key, { version, answer })
  try {
    return await answer
  } finally {
    if (inFlight.get(key)?.answer === answer) inFlight.delete(key)
  }
}

/** Forgets everything (tests). */
export function forgetRememberedReads(): void {
  remembered.clear()
  inFlight.clear()
}
