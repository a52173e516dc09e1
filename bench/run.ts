/**
 * `npm run bench`: runs every `bench/*.bench.ts` file in turn. Each file
 * default-exports an async function that prints its own figures and ratios.
 * Speed is measured here, never in timed tests.
 */
import { readdirSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'

const here = dirname(fileURLToPath(import.meta.url))
const only = process.argv[2]
const files = readdirSync(here).filter(f => f.endsWith('.bench.ts') && (!only || f.includes(only))).sort()
for (const file of files) {
  console.log(`\n=== ${file} ===`)
  const mod = await import(pathToFileURL(join(here, file)).href) as { default: () => Promise<void> }
  await mod.default()
}
