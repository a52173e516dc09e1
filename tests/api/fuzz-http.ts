/**
 * Raw HTTP for the fuzz tests, and the checks every answer must pass.
 *
 * `sendRaw` uses node:http rather than fetch so the address goes out exactly as written
 * (fetch would resolve '..' segments and re-encode characters) and the body and headers are
 * bytes of our choosing (broken multipart framing, invalid UTF-8).
 */
import http from 'node:http'

/** A request as the fuzzer builds it. */
export interface RawRequest {
  method: string
  /** path and query, already encoded ('/api/proposals/..?page=%00') */
  path: string
  headers: Record<string, string>
  body?: Buffer
}

/** What came back. */
export interface RawAnswer { status: number, headers: http.IncomingHttpHeaders, text: string }

const agent = new http.Agent({ keepAlive: true, maxSockets: 2 })

/**
 * Sends one request to `baseUrl` and reads the whole answer.
 *
 * @throws when no answer arrives within 60 s or the connection fails before an answer
 */
export function sendRaw(baseUrl: string, request: RawRequest): Promise<RawAnswer> {
  const url = new URL(baseUrl)
  return new Promise<RawAnswer>((resolve, reject) => {
    const outgoing = http.request({
      host: url.hostname, port: url.port, method: request.method, path: request.path, agent,
      headers: { ...request.headers, ...(request.body ? { 'content-length': String(request.body.length) } : {}) },
      timeout: 60_000,
    }, (response) => {
      const chunks: Buffer[] = []
      response.on('data', (chunk: Buffer) => chunks.push(chunk))
      response.on('end', () => resolve({ status: response.statusCode ?? 0, headers: response.headers, text: Buffer.concat(chunks).toString('utf8') }))
      response.on('error', reject)
    })
    outgoing.on('timeout', () => outgoing.destroy(new Error(`No answer within 60 s: ${request.method} ${request.path.slice(0, 200)}`)))
    // A server that answers 413 before reading the body may close the socket under a large write.
    outgoing.on('error', reject)
    outgoing.end(request.body)
  })
}

/** Closes the kept-alive connections (afterAll). */
export function closeRawConnections(): void {
  agent.destroy()
}

/**
 * Signs of internals in an answer: stack frames, source paths, dependency folders, SQL text,
 * driver and runtime error names. Generated input never contains these (see fuzz-inputs.ts),
 * so an answer that echoes the input cannot trip them.
 */
export const INTERNAL_DETAIL = /\bat \/|at \w+ \(|\.ts:\d|\.m?js:\d|\.ts:|node_modules|\/work\/|\/tmp\/|\.output\/|Sequelize|\bSELECT\b[\s\S]{0,200}\bFROM\b|\bINSERT INTO\b|\bDELETE FROM\b|\bUPDATE\s+"?\w+"?\s+SET\b|syntax error at|violates [a-z -]*constraint|relation "|column "|invalid byte sequence|invalid input syntax|out of range for type|\bpg_|ECONNREFUSED|TypeError|ReferenceError|RangeError|SyntaxError|Cannot read propert|is not a function|is not defined|\[object Object\]|"stack"/

/**
 * Everything wrong with one answer, as sentences (empty when it is fine):
 * - no 5xx (a 503 would mean the database or storage is down, which this test does not cause);
 * - an error (4xx) answers JSON `{ message }` with a sentence, and `issues` of `{ path, message }` on 422;
 * - no internal detail in error answers.
 */
export function answerProblems(answer: RawAnswer): string[] {
  const problems: string[] = []
  if (answer.status >= 500) problems.push(`answered ${answer.status}`)
  if (answer.status < 400) return problems
  if (INTERNAL_DETAIL.test(answer.text)) problems.push(`the error answer shows internals: ${answer.text.match(INTERNAL_DETAIL)?.[0]}`)
  if (!String(answer.headers['content-type'] ?? '').includes('application/json')) {
    problems.push(`the error answer is ${String(answer.headers['content-type'])}, not JSON`)
    return problems
  }
  let body: { message?: unknown, issues?: unknown }
  try {
    body = JSON.parse(answer.text) as typeof body
  } catch {
    return [...problems, 'the error answer is not valid JSON']
  }
  const message = body?.message
  if (typeof message !== 'string' || message.trim().length < 6 || !/[A-Za-z]{3,}/.test(message) || !/\s/.test(message.trim())) {
    problems.push(`the error answer has no readable message: ${answer.text.slice(0, 200)}`)
  } else if (/^(Error|undefined|null|Bad Request|Unprocessable Content|Internal Server Error)\.?$/i.test(message.trim()) || /Invalid input: expected|expected \w+, received/.test(message)) {
    problems.push(`the error message is not for people: ${message}`)
  }
  if (answer.status === 422) {
    const issues = body.issues
    const wellFormed = Array.isArray(issues) && issues.every(issue => typeof issue?.path === 'string' && typeof issue?.message === 'string' && issue.message.length > 0)
    if (!wellFormed) problems.push(`a 422 answer without its issues list: ${answer.text.slice(0, 200)}`)
  }
  return problems
}
