/**
 * server/utils/tokens.ts: token format, stored digest and the state rules.
 */
import { createHash } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { stubNitroGlobals, type FakeHttpError } from './stub-nitro'
import { generateToken, hashToken, INVITE_TOKEN_TTL_MS, RESET_TOKEN_TTL_MS, tokenRefusal, tokenState } from '../../../server/utils/tokens'

beforeAll(() => {
  stubNitroGlobals({
    gone: (message: string) => Object.assign(new Error(message), { statusCode: 410 }),
  })
})

describe('generateToken', () => {
  it('makes 43 base64url characters (32 random bytes) and stores their SHA-256 hex digest', () => {
    const { token, tokenHash } = generateToken()
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/)
    expect(Buffer.from(token, 'base64url')).toHaveLength(32)
    expect(tokenHash).toBe(createHash('sha256').update(token).digest('hex'))
    expect(tokenHash).toBe(hashToken(token))
  })

  it('never repeats in a thousand draws', () => {
    const seen = new Set(Array.from({ length: 1000 }, () => generateToken().token))
    expect(seen.size).toBe(1000)
  })
})

describe('tokenState', () => {
  const now = new Date('2025-06-01T12:00:00Z')
  it('is unknown without a row, used once stamped, expired at or after expiry, valid before', () => {
    expect(tokenState(null, now)).toBe('unknown')
    expect(tokenState({ expiresAt: new Date(now.getTime() + 1), usedAt: null }, now)).toBe('valid')
    expect(tokenState({ expiresAt: now, usedAt: null }, now)).toBe('expired')
    expect(tokenState({ expiresAt: new Date(now.getTime() + 1000), usedAt: now }, now)).toBe('used')
    expect(tokenState({ expiresAt: new Date(0), usedAt: now }, now)).toBe('used')
  })
})

describe('lifetimes and refusals', () => {
  it('invitations last 7 days, reset links 1 hour', () => {
    expect(INVITE_TOKEN_TTL_MS).toBe(7 * 24 * 3600 * 1000)
    expect(RESET_TOKEN_TTL_MS).toBe(3600 * 1000)
  })

  it('answers 404 for unknown and 410 for used or expired links, saying what to do', () => {
    const unknown = tokenRefusal('unknown', 'reset') as unknown as FakeHttpError
    expect(unknown.statusCode).toBe(404)
    expect(unknown.message).toMatch(/not valid.*Forgot password/)
    const expired = tokenRefusal('expired', 'invite') as unknown as FakeHttpError
    expect(expired.statusCode).toBe(410)
    expect(expired.message).toMatch(/expired.*administrator/)
    expect((tokenRefusal('used', 'reset') as unknown as FakeHttpError).message).toMatch(/already been used/)
  })
})
