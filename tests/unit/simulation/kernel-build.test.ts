/**
 * The WebAssembly kernels are committed as generated modules (shared/genetics/simulate/kernels/
 * *-wasm.ts) so that the engine needs no build step; this test compiles each AssemblyScript
 * source again and fails if its committed module is out of date (fix: `npm run build:kernels`).
 */
import { readFile } from 'node:fs/promises'
import { describe, expect, it } from 'vitest'
import { KERNELS, compileKernel, generatedPath, kernelModule } from '../../../scripts/build-kernels.mjs'

describe('committed WebAssembly kernels', () => {
  it.each(KERNELS)('kernels/%s.ts compiles to the committed module', async (name) => {
    const expected = kernelModule(name, await compileKernel(name))
    expect(await readFile(generatedPath(name), 'utf8')).toBe(expected)
  }, 60_000)
})
