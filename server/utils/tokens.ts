/**
 * One-time tokens for e-mailed links (invitations, password resets).
 *
 * A token is 32 random bytes in base64url (43 characters); only its SHA-256 hex digest is stored
 * (`user_tokens.token_hash`), so a copy of the database holds no usable link. Issuing a new
 * token of a purpose retires the user's earlier unused ones of that purpose. Using a token locks
 * its row and stamps `used_at` in the caller's transaction, so it works exactly once.
 */
import { randomBytes } from 'node:crypto'
import { Op, type Transaction } from 'sequelize'
import { hashToken, type UserToken } from '../db/models'
import type { TokenPurpose } from '#shared/types/db'

export const INVITE_TOKEN_TTL_MS = 7 * 24 * 60 * 60_000
export const RESET_TOKEN_TTL_MS = 60 * 60_000

/** A fresh token and the digest to store. */
export function generateToken(): { token: string, tokenHash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, tokenHash: hashToken(token) }
}

export { hashToken }

/** What a presented token is worth. */
export type TokenState = 'valid' | 'expired' | 'used' | 'unknown'

/**
 * The state of a stored token at `now` (a used token reads 'used' even when also expired).
 *
 * @example tokenState(null, new Date()) // 'unknown'
 */
export function tokenState(row: Pick<UserToken, 'expiresAt' | 'usedAt'> | null, now: Date): TokenState {
  if (!row) return 'unknown'
  if (row.usedAt) return 'used'
  if (row.expiresAt.getTime() <= now.getTime()) return 'expired'
  return 'valid'
}

/** The error for a token that cannot be used: 404 unknown, 410 used or expired. */
export function tokenRefusal(state: Exclude<TokenState, 'valid'>, purpose?: TokenPurpose) {
  const askAgain = purpose === 'invite'
    ? 'Ask your administrator to send a new invitation.'
    : purpose === 'reset'
      ? 'Ask for a new link on the sign-in page ("Forgot password").'
      : 'Ask for a new one: "Forgot password" on the sign-in page, or a new invitation from your administrator.'
  switch (state) {
    case 'unknown': return createError({ status: 404, statusText: 'Not Found', message: `This link is not valid: it may have been mistyped or cut off. ${askAgain}` })
    case 'used': return gone(`This link has already been used, or a newer one replaced it. ${askAgain}`)
    case 'expired': return gone(`This link has expired. ${askAgain}`)
  }
}

/**
 * Creates a token for `userId` and retires the user's earlier unused tokens of that purpose.
 *
 * @returns the token to put in the e-mailed link (never stored)
 */
export async function issueUserToken(transaction: Transaction, userId: number, purpose: TokenPurpose, ttlMs: number, now = new Date()): Promise<string> {
  const { models } = await useDb()
  await models.UserToken.update(
    { usedAt: now },
    { where: { userId, purpose, usedAt: { [Op.is]: null } }, transaction },
  )
  const { token, tokenHash } = generateToken()
  await models.UserToken.create({ userId, purpose, tokenHash, expiresAt: new Date(now.getTime() + ttlMs), usedAt: null }, { transaction })
  return token
}

/** Retires every unused token of a user (deactivation, password set). */
export async function retireUserTokens(transaction: Transaction, userId: number, now = new Date(), purpose?: TokenPurpose): Promise<void> {
  const { models } = await useDb()
  await models.UserToken.update(
    { usedAt: now },
    { where: { userId, usedAt: { [Op.is]: null }, ...(purpose ? { purpose } : {}) }, transaction },
  )
}

/** Finds a token by its text (no lock; for read-only checks). */
export async function findUserToken(token: string): Promise<UserToken | null> {
  const { models } = await useDb()
  return models.UserToken.findOne({ where: { tokenHash: hashToken(token) } })
}

/**
 * Locks the token's row, checks it is valid for `purpose` and stamps it used.
 * Throws 404/410 otherwise (a token of another purpose reads as unknown).
 *
 * @returns the token row (with `usedAt` set)
 */
export async function consumeUserToken(transaction: Transaction, token: string, purpose: TokenPurpose, now = new Date()): Promise<UserToken> {
  const { models } = await useDb()
  const row = await models.UserToken.findOne({ where: { tokenHash: hashToken(token) }, lock: transaction.LOCK.UPDATE, transaction })
  const state = tokenState(row && row.purpose === purpose ? row : null, now)
  if (state !== 'valid' || !row) throw tokenRefusal(state === 'valid' ? 'unknown' : state, purpose)
  row.usedAt = now
  await row.save({ transaction })
  return row
}
