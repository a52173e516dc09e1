/**
 * Local capturing SMTP server (see scripts/mail-catcher-lib.ts).
 * Run: `npx tsx scripts/mail-catcher.ts`
 * Ports: TRIBUTARY_MAIL_PORT (SMTP, default 2525) and TRIBUTARY_MAIL_HTTP_PORT (HTTP API,
 * default 2526), both on 127.0.0.1. Stops on SIGINT/SIGTERM.
 */
import { startMailCatcher } from './mail-catcher-lib'

function portFromEnv(name: string, fallback: number): number {
  const raw = process.env[name]
  if (raw === undefined || raw === '') return fallback
  const port = Number(raw)
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    console.error(`[mail-catcher] ${name} must be a port number (0–65535), got ${JSON.stringify(raw)}`)
    process.exit(2)
  }
  return port
}

const catcher = await startMailCatcher({
  smtpPort: portFromEnv('TRIBUTARY_MAIL_PORT', 2525),
  httpPort: portFromEnv('TRIBUTARY_MAIL_HTTP_PORT', 2526),
})
console.log(`[mail-catcher] SMTP on 127.0.0.1:${catcher.smtpPort}, messages at http://127.0.0.1:${catcher.httpPort}/messages`)

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    void catcher.close().then(() => process.exit(0))
  })
}
