/**
 * A capturing SMTP server for local work and tests: accepts every message on loopback, keeps it
 * in memory (parsed by mailparser) and lists the messages over a small HTTP API on loopback:
 *
 *   GET    /messages  → [{ id, to, from, subject, text, html, date, attachments: [{ filename, contentType, size }] }]
 *   DELETE /messages  → 204, forgets every message
 *
 * Nothing is relayed anywhere. STARTTLS is off (plain SMTP on 127.0.0.1); AUTH is accepted with
 * any credentials so an app configured with a user name still works against it.
 * Used by scripts/mail-catcher.ts (command line) and by the API test harness (in process).
 */
import { createServer, type Server as HttpServer } from 'node:http'
import type { AddressInfo } from 'node:net'
import { simpleParser, type AddressObject } from 'mailparser'
import { SMTPServer } from 'smtp-server'

/** One received message, as the HTTP API returns it. */
export interface CapturedMessage {
  id: string
  /** Recipient addresses (from the To header, else the SMTP envelope), lowercased. */
  to: string[]
  from: string
  subject: string
  text: string
  html: string | null
  /** ISO 8601 time the message was received. */
  date: string
  attachments: { filename: string, contentType: string, size: number }[]
}

export interface MailCatcher {
  /** Ports actually bound (useful when 0 asked the OS for free ones). */
  smtpPort: number
  httpPort: number
  /** Messages received so far, oldest first. */
  messages(): CapturedMessage[]
  /** Forgets every message. */
  clear(): void
  /** Stops both servers. */
  close(): Promise<void>
}

export interface MailCatcherOptions {
  /** SMTP port on 127.0.0.1 (0 = any free port). */
  smtpPort: number
  /** HTTP API port on 127.0.0.1 (0 = any free port). */
  httpPort: number
  /** Most messages kept; older ones are dropped first. Default 1000. */
  keep?: number
  /** Largest message accepted, bytes. Default 25 MiB. */
  maxMessageBytes?: number
}

const HOST = '127.0.0.1'

function addressesOf(field: AddressObject | AddressObject[] | undefined): string[] {
  const groups = field === undefined ? [] : Array.isArray(field) ? field : [field]
  const out: string[] = []
  for (const group of groups) {
    for (const entry of group.value) {
      if (entry.address) out.push(entry.address.toLowerCase())
      for (const member of entry.group ?? []) if (member.address) out.push(member.address.toLowerCase())
    }
  }
  return out
}

function listen(server: HttpServer | SMTPServer, port: number): Promise<number> {
  return new Promise((resolve, reject) => {
    const netServer = server instanceof SMTPServer ? (server as unknown as { server: import('node:net').Server }).server : server
    const onError = (error: Error) => reject(error)
    netServer.once('error', onError)
    server.listen(port, HOST, () => {
      netServer.off('error', onError)
      resolve((netServer.address() as AddressInfo).port)
    })
  })
}

/**
 * Starts the SMTP server and its HTTP API on loopback.
 *
 * @param options - ports (0 for any free port), retention and size limits
 * @returns handles to read and clear messages and to stop both servers
 * @example const catcher = await startMailCatcher({ smtpPort: 0, httpPort: 0 }); catcher.messages() // []
 */
export async function startMailCatcher(options: MailCatcherOptions): Promise<MailCatcher> {
  const keep = options.keep ?? 1000
  const stored: CapturedMessage[] = []
  let counter = 0

  const smtp = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    allowInsecureAuth: true,
    size: options.maxMessageBytes ?? 25 * 1024 * 1024,
    banner: 'Tributary local mail catcher (nothing is relayed)',
    logger: false,
    onAuth(_auth, _session, callback) {
      callback(null, { user: 'local' })
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const envelopeTo = session.envelope.rcptTo.map(r => r.address.toLowerCase())
          const headerTo = addressesOf(parsed.to)
          const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : ''
          counter += 1
          stored.push({
            id: String(counter),
            to: headerTo.length > 0 ? headerTo : envelopeTo,
            from: parsed.from?.text ?? envelopeFrom,
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            date: new Date().toISOString(),
            attachments: parsed.attachments.map(a => ({
              filename: a.filename ?? '',
              contentType: a.contentType,
              size: a.size,
            })),
          })
          while (stored.length > keep) stored.shift()
          callback()
        })
        .catch((error: unknown) => callback(error instanceof Error ? error : new Error(String(error))))
    },
  })
  smtp.on('error', (error) => {
    console.error(`[mail-catcher] SMTP error: ${error.message}`)
  })

  const http = createServer((request, response) => {
    const path = new URL(request.url ?? '/', `http://${HOST}`).pathname
    if (path === '/messages' && request.method === 'GET') {
      response.writeHead(200, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' })
      response.end(JSON.stringify(stored))
      return
    }
    if (path === '/messages' && request.method === 'DELETE') {
      stored.length = 0
      response.writeHead(204).end()
      return
    }
    response.writeHead(path === '/messages' ? 405 : 404, { 'content-type': 'application/json; charset=utf-8' })
    response.end(JSON.stringify({ message: 'Use GET or DELETE on /messages.' }))
  })

  const smtpPort = await listen(smtp, options.smtpPort)
  let httpPort: number
  try {
    httpPort = await listen(http, options.httpPort)
  } catch (error) {
    await new Promise<void>(resolve => smtp.close(() => resolve()))
    throw error
  }

  return {
    smtpPort,
    httpPort,
    messages: () => stored.slice(),
    clear: () => { stored.length = 0 },
    close: async () => {
      await Promise.all([
        new Promise<void>(resolve => smtp.close(() => resolve())),
        new Promise<void>((resolve) => {
          http.close(() => resolve())
          http.closeAllConnections()
        }),
      ])
    },
  }
}
