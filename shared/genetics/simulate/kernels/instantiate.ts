const compiled = new Map<string, WebAssembly.Module>()

/** Bytes in a WebAssembly memory page. */
const PAGE_BYTES = 65_536

/**
 * A memory for a kernel, of at least `bytes` bytes (at least one page).
 *
 * @param bytes - bytes needed
 * @returns a new memory, to pass as the kernel's `env.memory`
 */
export function kernelMemory(bytes: number): WebAssembly.Memory {
  return new WebAssembly.Memory({ initial: Math.max(1, Math.ceil(bytes / PAGE_BYTES)) })
}

/**
 * Grows a kernel's memory to at least `bytes` bytes, if needed. Growing detaches every typed
 * array over the old buffer: callers take their views afterwards.
 *
 * @param memory - the kernel's memory
 * @param bytes - bytes needed
 */
export function ensureMemoryBytes(memory: WebAssembly.Memory, bytes: number): void {
  const current = memory.buffer.byteLength
  if (bytes > current) memory.grow(Math.ceil((bytes - current) / PAGE_BYTES))
}

/**
 * A kernel's compiled WebAssembly module from its generated base64 text, decoded and compiled
 * once per thread (synchronous: the engine runs in worker threads and in Node, where that is
 * allowed for modules of any size).
 *
 * @param base64 - the bytes of a kernel, as in the generated *-wasm.ts modules
 * @returns the compiled module
 */
export function kernelModule(base64: string): WebAssembly.Module {
  let module = compiled.get(base64)
  if (!module) {
    const text = atob(base64)
    const bytes = new Uint8Array(text.length)
    for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i)
    module = new WebAssembly.Module(bytes)
    compiled.set(base64, module)
  }
  return module
}
