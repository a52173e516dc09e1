/**
 * Splits one line of delimited text into fields. Fields may be wrapped in
 * double quotes (then the delimiter may appear inside, and "" is a literal
 * quote); a quoted field cannot span lines. Returns the fields untrimmed, or
 * an error message in plain words.
 */
export function splitDelimitedLine(line: string, delimiter: string): { fields: string[] } | { error: string } {
  const fields: string[] = []
  let field = ''
  let index = 0
  let atFieldStart = true
  while (index <= line.length) {
    if (index === line.length) {
      fields.push(field)
      break
    }
    const char = line[index]
    if (atFieldStart && char === '"') {
      const closed = readQuoted(line, index + 1)
      if (closed === null) return { error: `a quoted field opened at column ${fields.length + 1} is not closed on this line` }
      field = closed.text
      index = closed.next
      // Only spaces may follow the closing quote before the delimiter.
      while (index < line.length && line[index] !== delimiter) {
        if (line[index]?.trim() !== '') return { error: `unexpected text after the closing quote in column ${fields.length + 1}` }
        index += 1
      }
      atFieldStart = false
      continue
    }
    if (char === delimiter) {
      fields.push(field)
      field = ''
      atFieldStart = true
    } else {
      field += char
      if (char?.trim() !== '') atFieldStart = false
    }
    index += 1
  }
  return { fields }
}

function readQuoted(line: string, start: number): { text: string, next: number } | null {
  let text = ''
  let index = start
  while (index < line.length) {
    const char = line[index]
    if (char === '"') {
      if (line[index + 1] === '"') {
        text += '"'
        index += 2
        continue
      }
      return { text, next: index + 1 }
    }
    text += char
    index += 1
  }
  return null
}

/** Picks the delimiter (comma, semicolon or tab) that occurs most often in the header line; comma on ties. */
export function detectDelimiter(headerLine: string): ',' | ';' | '\t' {
  const candidates = [',', ';', '\t'] as const
  let best: ',' | ';' | '\t' = ','
  let bestCount = 0
  for (const candidate of candidates) {
    const count = headerLine.split(candidate).length - 1
    if (count > bestCount) {
      best = candidate
      bestCount = count
    }
  }
  return best
}
