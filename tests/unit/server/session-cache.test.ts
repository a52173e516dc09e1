/**
 * The in-memory map from sealed session cookies to what they opened to
 * (server/utils/session-cache.ts): copies in and out, expiry at the session's own end or after
 * the cache's time limit, and a bounded size.
 */
import { beforeEach, describe, expect, it } from 'vitest'
import { forgetSessions, rememberedSession, rememberSession, SESSION_CACHE_SIZE, SESSION_CACHE_TTL_MS } from '../../../server/utils/session-cache'

const session = (createdAt: number) => ({ id: 'abc', createdAt, data: { user: { id: 3, role: 'biologist' } } })

beforeEach(() => forgetSessions())

describe('session cache', () => {
  it('gives back a copy of what was remembered, so a handler changing it changes nothing stored', () => {
    const now = 1_000_000
    rememberSession('sealed-1', session(now), 3600, now)
    const first = rememberedSession('sealed-1', now + 1)
    expect(first).toEqual(session(now))
    ;(first!.data.user as { role: string }).role = 'administrator'
    expect(rememberedSession('sealed-1', now + 2)?.data).toEqual({ user: { id: 3, role: 'biologist' } })
    expect(rememberedSession('another', now + 2)).toBeUndefined()
  })

  it('forgets an entry when the session itself expires (createdAt + maxAge)', () => {
    const created = 1_000_000
    rememberSession('sealed-2', session(created), 60, created + 30_000)
    expect(rememberedSession('sealed-2', created + 59_999)).toBeDefined()
    expect(rememberedSession('sealed-2', created + 60_000)).toBeUndefined()
  })

  it('forgets an entry after its time limit even when the session lasts longer', () => {
    const now = 5_000_000
    rememberSession('sealed-3', session(now), 12 * 3600, now)
    expect(rememberedSession('sealed-3', now + SESSION_CACHE_TTL_MS - 1)).toBeDefined()
    expect(rememberedSession('sealed-3', now + SESSION_CACHE_TTL_MS)).toBeUndefined()
  })

  it('does not remember an already expired session', () => {
    const created = 1_000_000
    rememberSession('sealed-4', session(created), 60, created + 61_000)
    expect(rememberedSession('sealed-4', created + 61_000)).toBeUndefined()
  })

  it(`keeps at most ${SESSION_CACHE_SIZE} sessions, forgetting the oldest first`, () => {
    const now = 1_000_000
    for (let i = 0; i <= SESSION_CACHE_SIZE; i++) rememberSession(`sealed-${i}`, session(now), 3600, now)
    expect(rememberedSession('sealed-0', now)).toBeUndefined()
    expect(rememberedSession('sealed-1', now)).toBeDefined()
    expect(rememberedSession(`sealed-${SESSION_CACHE_SIZE}`, now)).toBeDefined()
  })
})
