/**
 * shared/schemas/auth.ts: the password rule (length, common passwords, own address) and the
 * e-mail normalisation every sign-in form and route uses.
 */
import { describe, expect, it } from 'vitest'
import { EmailSchema, NewPasswordSchema, passwordProblem, PASSWORD_MIN_LENGTH } from '../../../shared/schemas/auth'
import { WEAK_PASSWORDS } from '../../../shared/schemas/weak-passwords'

describe('passwordProblem', () => {
  it('accepts a long, unusual passphrase', () => {
    expect(passwordProblem('moss under cedar bark')).toBeNull()
    expect(passwordProblem('river-otter-2031-slope', 'ada@agency.example')).toBeNull()
  })

  it('refuses fewer than 10 characters and more than 200', () => {
    expect(PASSWORD_MIN_LENGTH).toBe(10)
    expect(passwordProblem('abcdefgh9')).toBe('Use at least 10 characters.')
    expect(passwordProblem('cedarbark1')).toBeNull()
    expect(passwordProblem('ab'.repeat(101))).toBe('Use at most 200 characters.')
  })

  it('refuses well-known passwords in any letter case', () => {
    for (const weak of ['password123', 'qwertyuiop', 'Password123', 'QWERTYUIOP', '1234567890', 'tributary-demo']) {
      expect(passwordProblem(weak), weak).toMatch(/too common/)
    }
  })

  it('ships a list of about two hundred lowercase entries', () => {
    expect(WEAK_PASSWORDS.size).toBeGreaterThanOrEqual(200)
    for (const entry of WEAK_PASSWORDS) expect(entry).toBe(entry.toLowerCase())
  })

  it('refuses a run of one or two characters', () => {
    expect(passwordProblem('zzzzzzzzzzzz')).toMatch(/repeats/)
    expect(passwordProblem('xyxyxyxyxyxy')).toMatch(/repeats/)
  })

  it('refuses the address itself and its local part, also with trailing digits or symbols', () => {
    const email = 'jane.doe-smith@agency.example'
    expect(passwordProblem('jane.doe-smith@agency.example', email)).toMatch(/e-mail address/)
    expect(passwordProblem('Jane.Doe-Smith', email)).toMatch(/e-mail address/)
    expect(passwordProblem('jane.doe-smith2024!', email)).toMatch(/e-mail address/)
    expect(passwordProblem('jane.doe-smith2024!', 'someone.else@agency.example')).toBeNull()
  })

  it('refuses passwords that contain the local part of the address, also without its separators', () => {
    const email = 'jane.doe@agency.example'
    expect(passwordProblem('my-jane.doe-river', email)).toMatch(/e-mail address/)
    expect(passwordProblem('river JaneDoe lantern', email)).toMatch(/e-mail address/)
    expect(passwordProblem('river jane lantern', email)).toBeNull()
    // Local parts shorter than 4 characters are too common to refuse inside passwords.
    expect(passwordProblem('canada geese overhead', 'ada@agency.example')).toBeNull()
  })

  it('refuses passwords containing the application\'s name', () => {
    for (const named of ['MyTributaryLogin', 'tri-bu-tary rocks 9', 'river tributary lantern']) {
      expect(passwordProblem(named), named).toMatch(/name of this application/)
    }
  })

  it('feeds NewPasswordSchema (the e-mail rule needs the route)', () => {
    expect(NewPasswordSchema.safeParse('password123').success).toBe(false)
    expect(NewPasswordSchema.safeParse('moss under cedar bark').success).toBe(true)
    expect(NewPasswordSchema.safeParse(42).success).toBe(false)
  })
})

describe('EmailSchema', () => {
  it('trims and lowercases', () => {
    expect(EmailSchema.parse('  Ada.Lovelace@Example.ORG ')).toBe('ada.lovelace@example.org')
  })
  it('refuses non-addresses and overlong ones', () => {
    for (const bad of ['', 'ada', 'ada@', '@example.org', 'a b@example.org', `${'a'.repeat(250)}@example.org`]) {
      expect(EmailSchema.safeParse(bad).success, bad).toBe(false)
    }
  })
})
