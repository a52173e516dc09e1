/**
 * Limits on password guessing, kept in PostgreSQL (`sign_in_attempts`) so every app process
 * sees the same counts.
 *
 * Two keys per attempt: `account:<email>` and `address:<ip>`. An account allows 5 failures in
 * 15 minutes, counted since its last successful sign-in; an address allows 20 failures in 15
 * minutes whatever the account. Over either limit the route answers 429 with the time to wait.
 * Attempts refused by the limiter are not recorded (waiting is enough to get in again).
 * Wrong current passwords on the password-change form count against the account too.
 */
import type { H3Event } from 'h3'
import { QueryTypes, type Transaction } from 'sequelize'

/** At most `limit` failures within `windowMs`. */
export interface LimitRule { limit: number, windowMs: number }

export const ACCOUNT_LIMIT: LimitRule = { limit: 5, windowMs: 15 * 60_000 }
export const ADDRESS_LIMIT: LimitRule = { limit: 20, windowMs: 15 * 60_000 }
/** Rows older than this are deleted as new attempts come in. */
const KEEP_ATTEMPTS_MS = 24 * 60 * 60_000

/** One stored attempt, newest first when passed around. */
export interface AttemptRecord { attemptedAt: Date, succeeded: boolean }

export interface LimitVerdict {
  blocked: boolean
  /** When the next attempt will be allowed (null when not blocked). */
  retryAt: Date | null
  /** Failures that count now. */
  failures: number
}

/**
 * Decides whether a key is over its limit.
 *
 * Counts failures inside the window (optionally only those after the latest success). When the
 * count has reached `limit`, the key opens again once the `limit`-th most recent counted failure
 * leaves the window.
 *
 * @param attempts - attempts for one key, any order
 * @param rule - the limit and window
 * @param now - the current time
 * @param resetOnSuccess - true for accounts: a successful sign-in forgives earlier failures
 * @example evaluateLimit([], ACCOUNT_LIMIT, new Date()).blocked // false
 */
export function evaluateLimit(attempts: readonly AttemptRecord[], rule: LimitRule, now: Date, resetOnSuccess: boolean): LimitVerdict {
  const windowStart = now.getTime() - rule.windowMs
  const newestFirst = [...attempts]
    .filter(a => a.attemptedAt.getTime() > windowStart && a.attemptedAt.getTime() <= now.getTime())
    .sort((a, b) => b.attemptedAt.getTime() - a.attemptedAt.getTime())
  const failures: Date[] = []
  for (const attempt of newestFirst) {
    if (attempt.succeeded) {
      if (resetOnSuccess) break
      continue
    }
    failures.push(attempt.attemptedAt)
  }
  const pivot = failures[rule.limit - 1]
  if (failures.length < rule.limit || pivot === undefined) return { blocked: false, retryAt: null, failures: failures.length }
  return { blocked: true, retryAt: new Date(pivot.getTime() + rule.windowMs), failures: failures.length }
}

/**
 * "in 1 minute", "in 12 minutes", "in 30 seconds": how long until `retryAt`.
 *
 * @example waitWords(new Date(90_000), new Date(0)) // 'in 2 minutes'
 */
export function waitWords(retryAt: Date, now: Date): string {
  const seconds = Math.max(1, Math.ceil((retryAt.getTime() - now.getTime()) / 1000))
  if (seconds < 60) return `in ${seconds} ${seconds === 1 ? 'second' : 'seconds'}`
  const minutes = Math.ceil(seconds / 60)
  return `in ${minutes} ${minutes === 1 ? 'minute' : 'minutes'}`
}

/** The rate-limit keys of a sign-in attempt. */
export interface SignInKeys { account: string, address: string }

export function signInKeys(email: string, address: string): SignInKeys {
  return { account: `account:${email.trim().toLowerCase()}`, address: `address:${address}` }
}

/**
 * The client's IP address. X-Forwarded-For is believed only when runtimeConfig.trustProxy is
 * true (set NUXT_TRUST_PROXY=true behind a reverse proxy), or anyone could pick their own address.
 */
export function clientAddress(event: H3Event): string {
  const trustProxy = (useRuntimeConfig(event) as { trustProxy?: unknown }).trustProxy === true
  return getRequestIP(event, { xForwardedFor: trustProxy }) ?? 'unknown'
}

async function attemptsFor(transaction: Transaction, key: string, since: Date): Promise<AttemptRecord[]> {
  const { sequelize } = await useDb()
  const rows = await sequelize.query<{ attempted_at: Date, succeeded: boolean }>(
    'SELECT attempted_at, succeeded FROM sign_in_attempts WHERE key = :key AND attempted_at > :since ORDER BY attempted_at DESC LIMIT 200',
    { replacements: { key, since }, type: QueryTypes.SELECT, transaction },
  )
  return rows.map(row => ({ attemptedAt: new Date(row.attempted_at), succeeded: row.succeeded }))
}

/**
 * Serialises attempts on one account for the rest of the transaction, so parallel guesses
 * cannot all pass the check before any failure is recorded.
 */
export async function lockSignInKey(transaction: Transaction, key: string): Promise<void> {
  const { sequelize } = await useDb()
  await sequelize.query('SELECT pg_advisory_xact_lock(hashtext(:key))', { replacements: { key }, transaction })
}

/** Throws 429 (with Retry-After) when the account or the address is over its limit. */
export async function assertSignInAllowed(transaction: Transaction, keys: SignInKeys, now = new Date()): Promise<void> {
  const since = new Date(now.getTime() - Math.max(ACCOUNT_LIMIT.windowMs, ADDRESS_LIMIT.windowMs))
  const account = evaluateLimit(await attemptsFor(transaction, keys.account, since), ACCOUNT_LIMIT, now, true)
  const address = evaluateLimit(await attemptsFor(transaction, keys.address, since), ADDRESS_LIMIT, now, false)
  const verdicts = [account, address].filter(v => v.blocked && v.retryAt)
  if (verdicts.length === 0) return
  const retryAt = new Date(Math.max(...verdicts.map(v => v.retryAt!.getTime()))) // filtered above: retryAt is set
  const seconds = Math.ceil((retryAt.getTime() - now.getTime()) / 1000)
  const who = account.blocked ? 'this account' : 'this network address'
  throw tooManyRequests(`Too many failed sign-in attempts for ${who}. Try again ${waitWords(retryAt, now)}.`, seconds)
}

/** Stores the outcome of one attempt under both keys (and drops rows older than a day). */
export async function recordSignInAttempt(transaction: Transaction, keys: SignInKeys, succeeded: boolean, now = new Date()): Promise<void> {
  const { models, sequelize } = await useDb()
  await models.SignInAttempt.bulkCreate([
    { key: keys.account, succeeded, attemptedAt: now },
    { key: keys.address, succeeded, attemptedAt: now },
  ], { transaction })
  await sequelize.query('DELETE FROM sign_in_attempts WHERE attempted_at < :cutoff', {
    replacements: { cutoff: new Date(now.getTime() - KEEP_ATTEMPTS_MS) }, transaction,
  })
}
