/**
 * The whole rule for a new password chosen through a route (invite accept, password reset,
 * password change): the shared rule the forms check too (`passwordProblem`: length, the short
 * weak list, own address, the application's name), then the server's longer list of common and
 * leaked passwords (server/security/common-passwords.ts). Seeds set passwords directly and are
 * not checked.
 *
 *   const problem = await newPasswordProblem(password, user.email)
 *   if (problem) throw unprocessable(`password: ${problem}`, [{ path: 'password', message: problem }])
 */
import { passwordProblem } from '#shared/schemas/auth'
import { COMMON_PASSWORD_MESSAGE, isCommonPassword, parsePasswordList } from '../security/common-passwords'

/** Key of the list in Nitro's server assets (server/assets/passwords/common-passwords.txt). */
const LIST_KEY = 'passwords:common-passwords.txt'

let commonPasswords: Promise<Set<string>> | undefined

/** The list, read once per process. Throws when it is missing (a broken build, not a user error). */
function loadCommonPasswords(): Promise<Set<string>> {
  commonPasswords ??= useStorage('assets:server').getItemRaw(LIST_KEY).then((raw: unknown) => {
    const text = typeof raw === 'string' ? raw : raw instanceof Uint8Array ? Buffer.from(raw).toString('utf8') : ''
    const list = parsePasswordList(text)
    if (list.size === 0) throw new Error(`The common-password list (server/assets/${LIST_KEY.replace(':', '/')}) is missing or empty.`)
    return list
  })
  commonPasswords.catch(() => {
    commonPasswords = undefined
  })
  return commonPasswords
}

/**
 * Why `password` cannot be chosen, or null.
 *
 * @param password - the new password as typed
 * @param email - the account's address (refused inside the password)
 * @returns a sentence for the person, or null when the password is acceptable
 */
export async function newPasswordProblem(password: string, email: string): Promise<string | null> {
  const problem = passwordProblem(password, email)
  if (problem) return problem
  return isCommonPassword(password, await loadCommonPasswords()) ? COMMON_PASSWORD_MESSAGE : null
}
