// Entry of each replicate-pool thread. Worker threads do not inherit the TypeScript loader of
// the process that starts them (tsx, vitest), so the thread registers tsx itself and then loads
// the task from source.
import { register } from 'tsx/esm/api'

register()
const { default: runBlock } = await import('./block-task.ts')

export default runBlock
