/**
 * POST /api/auth/login { email, password } → 200 { user: SignedInUserDto } and the session cookie.
 * 401 with one message for an unknown address and a wrong password alike; 403 for a
 * deactivated account (only said once the password is right); 429 when rate-limited
 * (server/utils/rate-limit.ts). A hash made with older scrypt settings is upgraded here.
 */
import { LoginSchema } from '#shared/schemas/auth'
import type { SignInResponse } from '#shared/types/api'

const WRONG_CREDENTIALS = 'The e-mail address or password is not correct.'

export default defineEventHandler(async (event): Promise<SignInResponse> => {
  const { email, password } = await readBodyWith(event, LoginSchema, { maxBytes: 16 * 1024 })
  const keys = signInKeys(email, clientAddress(event))
  const { sequelize, models } = await useDb()
  const fallbackHash = await timingEqualiserHash()

  const outcome = await sequelize.transaction(async (t) => {
    await lockSignInKey(t, keys.account)
    await assertSignInAllowed(t, keys)
    const user = await models.User.findOne({ where: { email }, transaction: t })
    const matches = await passwordMatches(user?.passwordHash ?? fallbackHash, password)
    const succeeded = Boolean(user && user.passwordHash !== null && matches)
    await recordSignInAttempt(t, keys, succeeded)
    if (!user || !succeeded) return { kind: 'wrong' as const }
    if (!user.active) return { kind: 'inactive' as const }

    const changes: { lastSignInAt: Date, passwordHash?: string } = { lastSignInAt: new Date() }
    if (user.passwordHash && passwordNeedsReHash(user.passwordHash)) changes.passwordHash = await hashPassword(password)
    // Static update: signing in is not an edit, so the row's `version` stays as it is.
    await models.User.update(changes, { where: { id: user.id }, transaction: t })
    return { kind: 'signed-in' as const, user }
  })

  if (outcome.kind === 'wrong') throw unauthorized(WRONG_CREDENTIALS)
  if (outcome.kind === 'inactive') throw forbidden('This account has been deactivated. Ask your agency\'s administrator to reactivate it.')
  await startSession(event, sessionUserOf(outcome.user))
  return { user: signedInUserDto(outcome.user) }
})
