/**
 * Run-time additions to nuxt-security's headers (nuxt.config.ts `security`), which are fixed at
 * build time:
 * - over https (NUXT_APP_URL starts with https://): Strict-Transport-Security on every answer,
 *   and `upgrade-insecure-requests` in the pages' Content-Security-Policy; over plain http
 *   (local use, tests) neither, since they would break the app;
 * - an external tile server (NUXT_PUBLIC_TILE_URL) is added to the pages' img-src.
 */
import { defineNitroPlugin } from 'nitropack/runtime'
import { HSTS_VALUE, servesHttps, tileImageSource } from '../security/runtime-headers'

/** The slice of nuxt-security's per-route options this plugin edits. */
interface SecurityRouteOptions { headers?: false | { contentSecurityPolicy?: Record<string, string[] | string | boolean> | false } }

export default defineNitroPlugin((nitroApp) => {
  const config = useRuntimeConfig() as { appUrl?: unknown, public?: { tileUrl?: unknown } }
  const https = servesHttps(String(config.appUrl ?? ''))
  const tiles = tileImageSource(String(config.public?.tileUrl ?? ''))

  if (https) {
    nitroApp.hooks.hook('request', (event) => {
      setResponseHeader(event, 'strict-transport-security', HSTS_VALUE)
    })
  }

  nitroApp.hooks.hook('nuxt-security:routeRules', (routeRules) => {
    const headers = (routeRules['/**'] as SecurityRouteOptions | undefined)?.headers
    const csp = headers ? headers.contentSecurityPolicy : undefined
    if (!csp) return
    if (https) csp['upgrade-insecure-requests'] = true
    if (tiles) {
      const images = Array.isArray(csp['img-src']) ? csp['img-src'] : []
      if (!images.includes(tiles)) csp['img-src'] = [...images, tiles]
    }
  })
  void nitroApp.hooks.callHook('nuxt-security:ready')
})
