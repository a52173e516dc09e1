/**
 * The server's check of a new password against the list of common and leaked passwords
 * (server/assets/passwords/common-passwords.txt, built by scripts/build-common-passwords.ts).
 * Pure functions: the list is read by server/utils/password-rules.ts and passed in.
 *
 * A password counts as common when, lowercased, it is on the list; or when it still is after
 * letter-for-digit swaps are undone ('p@ssw0rd' → 'password'); or when what is left after the
 * digits and symbols at both ends are cut off ('Dragon_1987!!' → 'dragon') is on the list. Only
 * the whole remainder is looked up, so passphrases that merely contain a common word pass.
 */

/** Look-alike characters people swap in for letters, and the letter they stand for. */
const LOOK_ALIKES: Record<string, string> = { '@': 'a', '4': 'a', '8': 'b', '3': 'e', '6': 'g', '1': 'i', '!': 'i', '0': 'o', '$': 's', '5': 's', '7': 't', '2': 'z' }

/** Parses the plain-text list: one entry a line, lowercased; blank and "#" lines skipped. */
export function parsePasswordList(text: string): Set<string> {
  const entries = new Set<string>()
  for (const line of text.split(/\r?\n/)) {
    const entry = line.trim().toLowerCase()
    if (entry && !entry.startsWith('#')) entries.add(entry)
  }
  return entries
}

/** 'p@ssw0rd' → 'password'; also the variant where 1 stands for l ('1etmein' → 'letmein'). */
function withoutLookAlikes(text: string): string[] {
  const swapped = [...text].map(char => LOOK_ALIKES[char] ?? char).join('')
  const withL = [...text].map(char => (char === '1' ? 'l' : LOOK_ALIKES[char] ?? char)).join('')
  return swapped === withL ? [swapped] : [swapped, withL]
}

/** The password with the digits, symbols and spaces at both ends cut off. */
function core(text: string): string {
  return text.replace(/^[^\p{L}]+/u, '').replace(/[^\p{L}]+$/u, '')
}

/**
 * True when `password` is on `list`, directly or after undoing the usual disguises.
 *
 * @param password - the candidate, as typed
 * @param list - lowercase entries (parsePasswordList)
 * @example isCommonPassword('Sunshine2024!', list) // true ('sunshine' is listed)
 * @example isCommonPassword('moss under cedar bark', list) // false
 */
export function isCommonPassword(password: string, list: ReadonlySet<string>): boolean {
  const lowered = password.toLowerCase().trim()
  const candidates = new Set<string>([lowered, ...withoutLookAlikes(lowered)])
  const trimmed = core(lowered)
  // Digits at the ends are endings, not disguised letters: undo swaps only inside the core.
  if (trimmed.length >= 4) for (const variant of [trimmed, ...withoutLookAlikes(trimmed)]) candidates.add(variant)
  for (const candidate of candidates) if (list.has(candidate)) return true
  return false
}

/** The sentence shown when the password is on the list. */
export const COMMON_PASSWORD_MESSAGE = 'This password is on a list of common or leaked passwords, so it is easy to guess. Choose another one, for example a few unrelated words.'
