/**
 * One run-time configuration for every request.
 *
 * Nitro's `useRuntimeConfig(event)` builds a private copy of the whole configuration for each
 * request the first time anything asks for it (a deep clone, then every key looked up again in
 * the environment). nuxt-auth-utils and our own middleware ask on every request, and with
 * nuxt-security's route rules in the configuration that copy was about a fifth of the server's
 * CPU time per API request (profiled under `npm run load`).
 *
 * Nothing in Tributary or its modules changes the configuration while answering a request, and
 * the environment is read once at start (as `useRuntimeConfig()` without an event does), so each
 * request is given the shared, frozen configuration instead. Anything that tried to change it
 * would fail loudly (it is deep-frozen) rather than leak a change into other requests.
 */
import { defineNitroPlugin } from 'nitropack/runtime'

export default defineNitroPlugin((nitroApp) => {
  const shared = useRuntimeConfig()
  nitroApp.hooks.hook('request', (event) => {
    const nitro = event.context.nitro as { runtimeConfig?: unknown } | undefined
    if (nitro && !nitro.runtimeConfig) nitro.runtimeConfig = shared
  })
})
