import type { GenotypeParseError } from './types'

/** At most this many parse errors are returned; reading stops after the last one. */
export const MAX_PARSE_ERRORS = 100

/** Collects line-numbered parse errors up to `MAX_PARSE_ERRORS`. */
export class ParseErrorList {
  readonly errors: GenotypeParseError[] = []

  add(line: number, message: string): void {
    if (this.full) return
    this.errors.push({ line, message })
    if (this.errors.length === MAX_PARSE_ERRORS) {
      this.errors.push({ line, message: `stopped reading after ${MAX_PARSE_ERRORS} errors; fix these and upload again` })
    }
  }

  get full(): boolean {
    return this.errors.length > MAX_PARSE_ERRORS
  }

  get empty(): boolean {
    return this.errors.length === 0
  }
}

/** Splits text into lines (LF, CRLF or CR), dropping a leading byte-order mark; line i has number i + 1. */
export function splitLines(text: string): string[] {
  const withoutMark = text.charCodeAt(0) === 0xFEFF ? text.slice(1) : text
  return withoutMark.split(/\r\n|\n|\r/)
}
