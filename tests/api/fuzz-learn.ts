/**
 * Learns the shape of a route's JSON body from its own 422 answers, so the fuzzer can start
 * from a body the route accepts (or nearly) and break one thing at a time, reaching the rules
 * behind the schema instead of stopping at the first type check.
 *
 * Send `{}` → the issues name the required fields; fill each with a value that fits its message
 * ("Must be a number" → 1, 'Choose one of: "a", "b"' → "a", "Use at least 3 characters" →
 * "xxx" …), send again, and repeat a few times.
 */
import type { RawAnswer } from './fuzz-http'

/** What was learned: every field path named on the way, and the last body tried. */
export interface LearnedBody {
  fields: string[]
  /** a body that passed validation, or the closest one found */
  example: Record<string, unknown>
  /** true when the example got past validation (the answer was not 400/413/415/422) */
  accepted: boolean
  /** the route wants multipart/form-data instead of JSON */
  multipart: boolean
  probes: RawAnswer[]
}

interface Issue { path: string, message: string }

/** Values to try, in turn, when a message does not say what the field wants. */
const FALLBACKS: unknown[] = ['Fuzz value', 1, true, [], {}, '2024-05-01', 'fuzz@example.org', 0.5]

function issuesOf(answer: RawAnswer): Issue[] {
  if (answer.status !== 422) return []
  try {
    return ((JSON.parse(answer.text) as { issues?: Issue[] }).issues ?? []).filter(issue => typeof issue.path === 'string')
  } catch {
    return []
  }
}

/**
 * A value that should satisfy `message`, or undefined when the message does not say.
 *
 * @example valueForMessage('Choose one of: "csv", "geojson".') // 'csv'
 * @example valueForMessage('Must be a whole number, not text.') // 1
 */
export function valueForMessage(message: string, current: unknown): unknown {
  const choices = /(?:Choose one of|one of):? (.+?)\.?$/.exec(message) ?? /^Must be (".*"|\d+|true|false)\.$/.exec(message)
  if (choices) {
    const first = choices[1]!.split(/,\s*/)[0]! // group 1 of a successful match
    try {
      return JSON.parse(first)
    } catch { /* not JSON: fall through */ }
  }
  const atLeast = /at least (\d+(?:\.\d+)?)/.exec(message)
  if (/character/.test(message) && atLeast) return 'x'.repeat(Math.min(Number(atLeast[1]), 200))
  if (/item/.test(message) && atLeast) return Array.from({ length: Math.min(Number(atLeast[1]), 20) }, () => 1)
  if (atLeast) return Number(atLeast[1]) + (/greater|more than/.test(message) ? 1 : 0)
  if (/greater than|more than/i.test(message)) return 1
  const atMost = /at most (-?\d+(?:\.\d+)?)/.exec(message)
  if (atMost && typeof current === 'number') return Math.min(current, Number(atMost[1]))
  if (/e-mail/i.test(message)) return 'fuzz@example.org'
  if (/date and time/i.test(message)) return '2024-05-01T12:00:00Z'
  if (/\bdate\b|year/i.test(message) && typeof current !== 'number') return '2024-05-01'
  if (/whole number|a number|record number|version/i.test(message)) return 1
  if (/text|Enter a|name|title/i.test(message)) return 'Fuzz value'
  if (/true or false/i.test(message)) return true
  if (/a list/i.test(message)) return []
  if (/an object/i.test(message)) return {}
  return undefined
}

function setAt(body: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.')
  let node = body as Record<string, unknown> | unknown[]
  keys.forEach((key, index) => {
    const container = node as Record<string, unknown>
    if (index === keys.length - 1) {
      container[key] = value
      return
    }
    const next = container[key]
    if (next === null || typeof next !== 'object') container[key] = /^\d+$/.test(keys[index + 1]!) ? [] : {} // not the last key, so a next one exists
    node = container[key] as Record<string, unknown>
  })
}

function removeAt(body: Record<string, unknown>, path: string): void {
  const keys = path.split('.').filter(key => key !== '')
  const last = keys.pop()
  let node: unknown = body
  for (const key of keys) node = (node as Record<string, unknown> | undefined)?.[key]
  if (last && node && typeof node === 'object') Reflect.deleteProperty(node, last)
}

/**
 * Probes the route with `send` (up to `rounds` times) and returns what it learned.
 *
 * @param send - sends one JSON body to the route as the fuzzing caller
 */
export async function learnBody(send: (body: unknown) => Promise<RawAnswer>, rounds = 6): Promise<LearnedBody> {
  const body: Record<string, unknown> = {}
  const fields = new Set<string>()
  const attempts = new Map<string, number>()
  const probes: RawAnswer[] = []
  for (let round = 0; round < rounds; round++) {
    const answer = await send(body)
    probes.push(answer)
    if (round === 0 && answer.status === 415 && /multipart/i.test(answer.text)) return { fields: [], example: {}, accepted: false, multipart: true, probes }
    if (![400, 413, 415, 422].includes(answer.status)) return { fields: [...fields], example: body, accepted: true, multipart: false, probes }
    const issues = issuesOf(answer)
    if (issues.length === 0) break
    for (const issue of issues) {
      const unknown = /^Unknown fields?: (.+)\.$/.exec(issue.message)
      if (unknown) {
        for (const key of unknown[1]!.split(/,\s*/)) removeAt(body, issue.path ? `${issue.path}.${key}` : key) // group 1 of a successful match
        continue
      }
      if (issue.path === '') continue
      fields.add(issue.path)
      const tried = attempts.get(issue.path) ?? 0
      attempts.set(issue.path, tried + 1)
      const current = issue.path.split('.').reduce<unknown>((node, key) => (node as Record<string, unknown> | undefined)?.[key], body)
      const guess = tried < 2 ? valueForMessage(issue.message, current) : undefined
      setAt(body, issue.path, guess !== undefined && JSON.stringify(guess) !== JSON.stringify(current) ? guess : FALLBACKS[tried % FALLBACKS.length])
    }
  }
  return { fields: [...fields], example: body, accepted: false, multipart: false, probes }
}
