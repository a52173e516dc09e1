/**
 * Tributary's genetics engine: pure TypeScript used by the browser (live
 * what-if results) and the server (stored results, briefs). No Vue, Nitro or
 * database imports anywhere under this folder.
 *
 * Each topic folder owns its own `index.ts`; this barrel re-exports them.
 */
export * from './validate'
export * from './fixation'
export * from './exact'
export * from './drift'
export * from './effective-size'
export * from './load'
export * from './outbreeding'
export * from './genotypes'
export * from './cautions'
export * from './simulate'
