/**
 * File-name cleaning (sanitizeFileName, fileNameExtension) and the Content-Disposition value of
 * download links (contentDisposition): path tricks, control and reserved characters, length.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { contentDisposition } from '../../../server/utils/storage'
import { fileNameExtension, sanitizeFileName } from '../../../server/utils/uploads'

describe('sanitizeFileName', () => {
  it.each([
    ['../../etc/passwd', 'passwd'],
    ['..\\..\\Windows\\win.ini', 'win.ini'],
    ['C:\\Users\\a\\permit.pdf', 'permit.pdf'],
    ['/absolute/path/report.pdf', 'report.pdf'],
    ['..', 'file'],
    ['.', 'file'],
    ['', 'file'],
    ['   ', 'file'],
    ['.htaccess', 'htaccess'],
    ['rapport\u0000.pdf', 'rapport.pdf'],
    ['line\nbreak.txt', 'linebreak.txt'],
    ['a<b>c:d"e|f?g*.csv', 'a_b_c_d_e_f_g_.csv'],
    ['trailing dots...', 'trailing dots'],
    ['CON.txt', '_CON.txt'],
    ['nul', '_nul'],
    ['Ökologie  Bericht.pdf', 'Ökologie Bericht.pdf'],
    ['e\u0301cole.txt', 'école.txt'],
    // bidirectional overrides make 'gpj.exe' read as 'exe.jpg'; zero-width characters hide in names
    ['\u202Egpj.exe', 'gpj.exe'],
    ['invoice\u202Efdp.exe', 'invoicefdp.exe'],
    ['re\u200Bport\u2066.pdf', 'report.pdf'],
    ['half \uD83E pair.txt', 'half pair.txt'],
  ])('%j → %j', (input, expected) => {
    expect(sanitizeFileName(input)).toBe(expected)
  })

  it('keeps the ending when shortening to 120 characters', () => {
    const long = `${'a'.repeat(300)}.xlsx`
    const cleaned = sanitizeFileName(long)
    expect(cleaned.length).toBe(120)
    expect(cleaned.endsWith('.xlsx')).toBe(true)
  })

  it('never cuts a character in two when shortening (the stored name would differ from the one shown)', () => {
    const cleaned = sanitizeFileName(`${'x'.repeat(117)}${'🦎'.repeat(5)}`)
    expect(cleaned).toBe(`${'x'.repeat(117)}🦎`)
    fc.assert(fc.property(fc.array(fc.constantFrom('a', 'é', '🦎', '𝕏', ' ', '\u202E'), { minLength: 100, maxLength: 140 }).map(parts => parts.join('')), fc.constantFrom('', '.csv', '.🦎🦎'), (stem, ending) => {
      const kept = sanitizeFileName(`${stem}${ending}`)
      expect(kept).toBe(kept.toWellFormed())
      expect(kept.length).toBeLessThanOrEqual(121)
    }), { numRuns: 200, seed: 9 })
  })

  it('never returns path separators, control characters, leading dots or an empty name (property)', () => {
    // Names built from the characters that matter (path parts, dots, controls, reserved), plus any text.
    const tricky = fc.array(fc.constantFrom('/', '\\', '.', '..', ' ', '\u0000', '\n', '\u007F', '\u0085', ':', '"', '<', '|', '*', 'a', 'CON', 'é', 'e\u0301', '.pdf'), { maxLength: 40 })
      .map(parts => parts.join(''))
    fc.assert(fc.property(fc.oneof(tricky, fc.string({ maxLength: 200 })), (name) => {
      const cleaned = sanitizeFileName(name)
      // eslint-disable-next-line no-control-regex -- checking that control characters are gone
      expect(cleaned).not.toMatch(/[/\\\u0000-\u001F\u007F<>:"|?*]/)
      expect(cleaned).not.toMatch(/^[.\s]/)
      expect(cleaned.length).toBeGreaterThan(0)
      expect(cleaned.length).toBeLessThanOrEqual(121) // 120, plus "_" before a reserved device name
    }), { numRuns: 200 })
  })
})

describe('fileNameExtension', () => {
  it.each([['a.PDF', '.pdf'], ['archive.tar.gz', '.gz'], ['noending', ''], ['dot.', ''], ['a.b c', '']])('%j → %j', (input, expected) => {
    expect(fileNameExtension(input)).toBe(expected)
  })
})

describe('contentDisposition', () => {
  it('gives an ASCII fallback and the UTF-8 name', () => {
    expect(contentDisposition('Permit 2024 (Ö).pdf')).toBe('attachment; filename="Permit 2024 (_).pdf"; filename*=UTF-8\'\'Permit%202024%20%28%C3%96%29.pdf')
  })
  it('cannot be broken out of by quotes, backslashes or line breaks', () => {
    const value = contentDisposition('a"b\\c\r\nSet-Cookie: x.txt')
    expect(value).not.toMatch(/[\r\n]/)
    expect(value.split('"').length).toBe(3)
  })
  it('does not throw on half a surrogate pair', () => {
    expect(contentDisposition('a\uD83E.txt')).toBe('attachment; filename="a_.txt"; filename*=UTF-8\'\'a%EF%BF%BD.txt')
  })
})
