/**
 * server/security/common-passwords.ts and the shipped list
 * (server/assets/passwords/common-passwords.txt, scripts/build-common-passwords.ts): common and
 * leaked passwords are refused also in disguise (letter case, look-alike digits, endings),
 * passphrases are not. Expected values: the documented rules (common practice, no source).
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { isCommonPassword, parsePasswordList } from '../../../server/security/common-passwords'
import { WEAK_PASSWORDS } from '../../../shared/schemas/weak-passwords'

const list = parsePasswordList(readFileSync(new URL('../../../server/assets/passwords/common-passwords.txt', import.meta.url), 'utf8'))

describe('the shipped list', () => {
  it('holds thousands of lowercase entries, the browser-side list among them', () => {
    expect(list.size).toBeGreaterThan(5000)
    expect([...list].filter(entry => entry !== entry.toLowerCase())).toEqual([])
    expect([...WEAK_PASSWORDS].filter(entry => !list.has(entry))).toEqual([])
    expect(list.has('# common and leaked passwords')).toBe(false)
  })
})

describe('isCommonPassword', () => {
  it('refuses listed passwords in any case, with look-alikes or with endings', () => {
    for (const weak of ['sunshine2024', 'Sunshine2024!', 'SUNSHINE', 'p@ssw0rd2024', 'Pa55word!!', 'Dragon_1987!!', '!!!monkey123', 'iloveyou1234', 'liverpool2025', 'qwertyuiop', '1234567890', 'butterflybutterfly', '  Football123  ']) {
      expect(isCommonPassword(weak, list), weak).toBe(true)
    }
  })

  it('accepts passphrases and uncommon strings, even when they contain a common word', () => {
    for (const good of ['moss under cedar bark', 'river-otter-2031-slope', 'cedarbark1', 'dragon lantern quietly', 'Fernwhistle#Gap#77', 'xk4!qz9-Pw2m']) {
      expect(isCommonPassword(good, list), good).toBe(false)
    }
  })

  it('parses comments, blank lines and Windows line ends', () => {
    expect([...parsePasswordList('# note\r\nAlpha\r\n\r\n beta \n')]).toEqual(['alpha', 'beta'])
  })
})
