/**
 * Local S3-compatible object store (see scripts/object-store-lib.ts).
 * Run: `npx tsx scripts/object-store.ts`
 * Port: TRIBUTARY_S3_PORT (default 4569) on 127.0.0.1; files in TRIBUTARY_S3_DIR (default
 * .data/object-store); bucket NUXT_S3_BUCKET (default tributary). Stops on SIGINT/SIGTERM.
 */
import { resolve } from 'node:path'
import { startObjectStore } from './object-store-lib'

const raw = process.env.TRIBUTARY_S3_PORT
const port = raw === undefined || raw === '' ? 4569 : Number(raw)
if (!Number.isInteger(port) || port < 0 || port > 65535) {
  console.error(`[object-store] TRIBUTARY_S3_PORT must be a port number (0–65535), got ${JSON.stringify(raw)}`)
  process.exit(2)
}
const directory = resolve(process.env.TRIBUTARY_S3_DIR || '.data/object-store')
const bucket = process.env.NUXT_S3_BUCKET || 'tributary'

const store = await startObjectStore({ port, directory, bucket, verbose: process.env.TRIBUTARY_S3_VERBOSE === '1' })
console.log(`[object-store] S3 API on ${store.endpoint}, bucket "${store.bucket}", files in ${store.directory}`)

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    void store.close().then(() => process.exit(0))
  })
}
