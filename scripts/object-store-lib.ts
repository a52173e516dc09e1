/**
 * A local S3-compatible object store for development and tests: s3rver on 127.0.0.1, files
 * kept under `directory`, the bucket created at start. Nothing leaves the machine.
 * Used by scripts/object-store.ts (command line) and by the test harness (one private store per
 * test file, tests/support/server.ts).
 *
 *   const store = await startObjectStore({ port: 0, directory: '/tmp/store' })
 *   console.log(store.endpoint)  // http://127.0.0.1:40123
 *   await store.close()
 *
 * s3rver checks the expiry of presigned links (so short-lived download links really expire),
 * accepts any credentials, and needs path-style addressing (`forcePathStyle: true`).
 */
import { mkdir } from 'node:fs/promises'
import { createRequire } from 'node:module'
import type { AddressInfo } from 'node:net'

/** The part of s3rver 3.7's API used here (the package ships no types). */
interface S3rverInstance {
  run(): Promise<AddressInfo | string | null>
  close(): Promise<void>
}
type S3rverConstructor = new (options: Record<string, unknown>) => S3rverInstance

const S3rver = createRequire(import.meta.url)('s3rver') as S3rverConstructor

export interface ObjectStoreServer {
  /** The port actually bound (useful when 0 asked the OS for a free one). */
  port: number
  /** `http://127.0.0.1:<port>` */
  endpoint: string
  bucket: string
  directory: string
  /** Stops the server; the files stay in `directory`. */
  close(): Promise<void>
}

export interface ObjectStoreOptions {
  /** port on 127.0.0.1 (0 = any free port) */
  port: number
  /** where objects are kept (created if missing) */
  directory: string
  /** bucket created at start (default 'tributary') */
  bucket?: string
  /** log each request (default false) */
  verbose?: boolean
}

/**
 * Starts s3rver on loopback with the bucket in place.
 *
 * @param options - port, directory, bucket
 * @returns the running server's address and a `close()`
 */
export async function startObjectStore(options: ObjectStoreOptions): Promise<ObjectStoreServer> {
  const bucket = options.bucket ?? 'tributary'
  await mkdir(options.directory, { recursive: true })
  const server = new S3rver({
    address: '127.0.0.1',
    port: options.port,
    directory: options.directory,
    silent: !options.verbose,
    configureBuckets: [{ name: bucket, configs: [] }],
  })
  const address = await server.run()
  const port = typeof address === 'object' && address ? address.port : options.port
  let closed = false
  return {
    port,
    endpoint: `http://127.0.0.1:${port}`,
    bucket,
    directory: options.directory,
    async close() {
      if (closed) return
      closed = true
      await server.close()
    },
  }
}
