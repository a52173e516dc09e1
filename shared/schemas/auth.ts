/**
 * Request bodies of the sign-in, password and invitation routes (server/api/auth/**,
 * server/api/me/**) and of the matching forms. One schema, two uses: the route validates with
 * it through `readBodyWith`, the form with the same object.
 *
 * Password rule (`passwordProblem`): at least 10 characters, at most 200, not one of the
 * well-known weak passwords in ./weak-passwords.ts, not containing the application's name, and
 * not containing the account's own e-mail address or its local part. The last check needs the
 * address, so routes call `passwordProblem(password, email)` after the schema has passed. The
 * server adds the longer list of common and leaked passwords (server/security/common-passwords.ts),
 * too large to ship to the browser.
 */
import { z } from 'zod'
import { WEAK_PASSWORDS } from './weak-passwords'

/** Shortest password accepted when one is set (sign-in accepts whatever was set before). */
export const PASSWORD_MIN_LENGTH = 10
/** Longest password accepted: scrypt hashes anything, but a limit keeps requests small. */
export const PASSWORD_MAX_LENGTH = 200
/** Longest e-mail address (RFC 5321 path limit). */
export const EMAIL_MAX_LENGTH = 254

/** A trimmed, lowercased e-mail address. */
export const EmailSchema = z.string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .min(1, 'Enter an e-mail address.')
  .max(EMAIL_MAX_LENGTH, `An e-mail address has at most ${EMAIL_MAX_LENGTH} characters.`)
  .pipe(z.email('Enter a valid e-mail address, like name@agency.example.'))

/** The application's name, refused inside passwords (it is the first word anyone would try). */
const PRODUCT_NAME = 'tributary'

/** Letters and digits only ('Jane.Doe-2' → 'janedoe2'), so separators do not hide a name. */
function lettersOnly(text: string): string {
  return text.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, '')
}

/**
 * True when the password contains the address, or its local part (also with its dots, dashes
 * and underscores left out). Local parts shorter than 4 characters are too common to refuse.
 */
function containsOwnAddress(loweredPassword: string, email: string): boolean {
  const address = email.trim().toLowerCase()
  const localPart = address.split('@')[0] ?? ''
  if (loweredPassword.includes(address)) return true
  if (localPart.length < 4) return false
  const compactLocal = lettersOnly(localPart)
  return loweredPassword.includes(localPart) || (compactLocal.length >= 4 && lettersOnly(loweredPassword).includes(compactLocal))
}

/**
 * Why a new password is refused, or null when it is acceptable.
 *
 * @param password - the candidate, as typed
 * @param email - the account's address, when known; its local part is refused too
 * @returns a sentence for the person choosing the password, or null
 * @example passwordProblem('qwertyuiop') // 'This password is too common …'
 * @example passwordProblem('my-jane.doe-key', 'jane.doe@agency.example') // 'Do not use your e-mail address …'
 * @example passwordProblem('TributaryRocks!') // 'Do not use the name of this application …'
 * @example passwordProblem('moss under cedar bark') // null
 */
export function passwordProblem(password: string, email?: string): string | null {
  if (password.length < PASSWORD_MIN_LENGTH) return `Use at least ${PASSWORD_MIN_LENGTH} characters.`
  if (password.length > PASSWORD_MAX_LENGTH) return `Use at most ${PASSWORD_MAX_LENGTH} characters.`
  const lowered = password.toLowerCase()
  if (WEAK_PASSWORDS.has(lowered)) return 'This password is too common and easy to guess. Choose another one, for example a few unrelated words.'
  if (new Set(lowered).size <= 2) return 'This password repeats the same characters. Choose another one.'
  if (email && containsOwnAddress(lowered, email)) {
    return 'Do not use your e-mail address, or the name before its @, in your password. Choose another one.'
  }
  if (lettersOnly(lowered).includes(PRODUCT_NAME)) {
    return `Do not use the name of this application (${PRODUCT_NAME}) in your password. Choose another one.`
  }
  return null
}

/** A new password: the length and common-password rules (the e-mail rule is checked by the route). */
export const NewPasswordSchema = z.string({ error: 'Enter a password.' })
  .superRefine((value, context) => {
    const problem = passwordProblem(value)
    if (problem) context.addIssue({ code: 'custom', message: problem })
  })

/** A password typed to prove who you are: any non-empty string of a sane length. */
const ExistingPasswordSchema = z.string({ error: 'Enter your password.' })
  .min(1, 'Enter your password.')
  .max(PASSWORD_MAX_LENGTH, `A password has at most ${PASSWORD_MAX_LENGTH} characters.`)

/** A token from an e-mailed link (43 base64url characters when we made it). */
export const TokenSchema = z.string({ error: 'The link is missing its token.' })
  .trim()
  .min(1, 'The link is missing its token.')
  .max(200, 'This link is not valid.')

/** A person's display name. */
export const PersonNameSchema = z.string({ error: 'Enter a name.' })
  .trim()
  .min(1, 'Enter a name.')
  .max(120, 'A name has at most 120 characters.')

/** POST /api/auth/login */
export const LoginSchema = z.object({
  email: EmailSchema,
  password: ExistingPasswordSchema,
})
export type LoginInput = z.infer<typeof LoginSchema>

/** POST /api/me/password */
export const ChangePasswordSchema = z.object({
  currentPassword: ExistingPasswordSchema,
  newPassword: NewPasswordSchema,
})
export type ChangePasswordInput = z.infer<typeof ChangePasswordSchema>

/** POST /api/auth/password/forgot */
export const ForgotPasswordSchema = z.object({ email: EmailSchema })
export type ForgotPasswordInput = z.infer<typeof ForgotPasswordSchema>

/** POST /api/auth/password/reset */
export const ResetPasswordSchema = z.object({
  token: TokenSchema,
  password: NewPasswordSchema,
})
export type ResetPasswordInput = z.infer<typeof ResetPasswordSchema>

/** POST /api/auth/invite/accept */
export const AcceptInviteSchema = z.object({
  token: TokenSchema,
  name: PersonNameSchema,
  password: NewPasswordSchema,
})
export type AcceptInviteInput = z.infer<typeof AcceptInviteSchema>

/** GET /api/auth/tokens/:token */
export const TokenParamsSchema = z.object({ token: TokenSchema })
