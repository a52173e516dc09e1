/**
 * server/utils/rate-limit.ts `evaluateLimit` and `waitWords`: the counting rules behind the
 * sign-in limits (5 failures / 15 min per account since its last success, 20 per address).
 */
import { describe, expect, it } from 'vitest'
import { ACCOUNT_LIMIT, ADDRESS_LIMIT, evaluateLimit, signInKeys, waitWords, type AttemptRecord } from '../../../server/utils/rate-limit'

const now = new Date('2025-06-01T12:00:00Z')
const minutesAgo = (m: number) => new Date(now.getTime() - m * 60_000)
const fail = (m: number): AttemptRecord => ({ attemptedAt: minutesAgo(m), succeeded: false })
const ok = (m: number): AttemptRecord => ({ attemptedAt: minutesAgo(m), succeeded: true })

describe('evaluateLimit', () => {
  it('allows up to limit − 1 failures in the window', () => {
    const verdict = evaluateLimit([fail(1), fail(2), fail(3), fail(4)], ACCOUNT_LIMIT, now, true)
    expect(verdict).toEqual({ blocked: false, retryAt: null, failures: 4 })
  })

  it('blocks at the limit until the limit-th most recent failure leaves the window', () => {
    const attempts = [fail(1), fail(2), fail(3), fail(4), fail(10), fail(12)]
    const verdict = evaluateLimit(attempts, ACCOUNT_LIMIT, now, true)
    expect(verdict.blocked).toBe(true)
    expect(verdict.failures).toBe(6)
    // The 5th most recent failure is 10 minutes old: it leaves the 15-minute window in 5 minutes.
    expect(verdict.retryAt?.toISOString()).toBe(new Date(minutesAgo(10).getTime() + 15 * 60_000).toISOString())
    // At that moment only 4 failures count, so the key opens.
    const later = new Date(verdict.retryAt!.getTime() + 1) // set: blocked above
    expect(evaluateLimit(attempts, ACCOUNT_LIMIT, later, true).blocked).toBe(false)
  })

  it('ignores failures older than the window', () => {
    const verdict = evaluateLimit([fail(16), fail(20), fail(30), fail(40), fail(50), fail(1)], ACCOUNT_LIMIT, now, true)
    expect(verdict).toEqual({ blocked: false, retryAt: null, failures: 1 })
  })

  it('forgives earlier failures after a success for accounts, not for addresses', () => {
    const attempts = [fail(1), fail(2), ok(3), fail(4), fail(5), fail(6), fail(7)]
    expect(evaluateLimit(attempts, ACCOUNT_LIMIT, now, true).failures).toBe(2)
    expect(evaluateLimit(attempts, { limit: 6, windowMs: ADDRESS_LIMIT.windowMs }, now, false))
      .toMatchObject({ blocked: true, failures: 6 })
  })

  it('does not depend on the order attempts arrive in', () => {
    const attempts = [fail(1), fail(2), fail(3), fail(4), fail(5)]
    const shuffled = [attempts[3]!, attempts[0]!, attempts[4]!, attempts[1]!, attempts[2]!] // fixed indices of a 5-element array
    expect(evaluateLimit(shuffled, ACCOUNT_LIMIT, now, true)).toEqual(evaluateLimit(attempts, ACCOUNT_LIMIT, now, true))
  })

  it('the address limit is 20', () => {
    const nineteen = Array.from({ length: 19 }, (_, i) => fail(i * 0.5))
    expect(evaluateLimit(nineteen, ADDRESS_LIMIT, now, false).blocked).toBe(false)
    expect(evaluateLimit([...nineteen, fail(10)], ADDRESS_LIMIT, now, false).blocked).toBe(true)
  })
})

describe('waitWords', () => {
  it('rounds up to whole seconds below a minute and whole minutes above', () => {
    expect(waitWords(new Date(now.getTime() + 1_000), now)).toBe('in 1 second')
    expect(waitWords(new Date(now.getTime() + 30_500), now)).toBe('in 31 seconds')
    expect(waitWords(new Date(now.getTime() + 60_000), now)).toBe('in 1 minute')
    expect(waitWords(new Date(now.getTime() + 61_000), now)).toBe('in 2 minutes')
    expect(waitWords(new Date(now.getTime() - 5_000), now)).toBe('in 1 second')
  })
})

describe('signInKeys', () => {
  it('normalises the e-mail address', () => {
    expect(signInKeys(' Ada@Example.org ', '127.0.0.1')).toEqual({ account: 'account:ada@example.org', address: 'address:127.0.0.1' })
  })
})
