const compiled = new Map<string, WebAssembly.Module>()

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
