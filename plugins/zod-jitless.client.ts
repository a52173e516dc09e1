/**
 * Zod in the browser without its compiled fast path: zod probes whether it may compile code with
 * `new Function`, and the Content-Security-Policy (nuxt.config.ts `security`, no 'unsafe-eval')
 * reports that probe as a violation even though zod falls back quietly. `jitless` skips the
 * probe; validation in forms is the same, only not compiled. The server keeps the fast path.
 */
import { z } from 'zod'

export default defineNuxtPlugin({
  name: 'zod-jitless',
  enforce: 'pre',
  setup() {
    z.config({ jitless: true })
  },
})
