/** Types of scripts/build-kernels.mjs, for the test that checks the committed kernel modules. */
export const KERNELS: string[]
export function compileKernel(name: string): Promise<Uint8Array>
export function kernelModule(name: string, binary: Uint8Array): string
export function generatedPath(name: string): string
