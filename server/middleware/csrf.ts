/**
 * Refuses cross-site requests that would change something: POST, PUT, PATCH and DELETE under
 * /api answer 403 with a plain message before any route runs (so nothing is written) when the
 * browser says they came from another site (server/security/request-origin.ts has the rules).
 * The app's origins are runtimeConfig.appUrl and the Host the request was sent to; behind a
 * reverse proxy (NUXT_TRUST_PROXY=true) X-Forwarded-Host and X-Forwarded-Proto count instead.
 */
import { crossSiteRefusal, ownOrigins } from '../security/request-origin'

const CHANGING_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

/** First value of a header that may be repeated or comma-joined by proxies. */
function firstValue(value: string | string[] | undefined): string | undefined {
  const text = Array.isArray(value) ? value[0] : value
  return text?.split(',')[0]?.trim() || undefined
}

export default defineEventHandler((event) => {
  if (!CHANGING_METHODS.has(event.method)) return
  const path = event.path.split('?')[0] ?? ''
  if (path !== '/api' && !path.startsWith('/api/')) return

  const headers = event.node.req.headers
  const config = useRuntimeConfig(event) as { appUrl?: unknown, trustProxy?: unknown }
  const trustProxy = config.trustProxy === true
  const encrypted = Boolean((event.node.req.socket as { encrypted?: boolean }).encrypted)
  const host = (trustProxy ? firstValue(headers['x-forwarded-host']) : undefined) ?? firstValue(headers.host)
  const protocol = (trustProxy ? firstValue(headers['x-forwarded-proto']) : undefined) ?? (encrypted ? 'https' : 'http')
  const refusal = crossSiteRefusal({
    origin: firstValue(headers.origin),
    referer: Array.isArray(headers.referer) ? headers.referer[0] : headers.referer,
    secFetchSite: firstValue(headers['sec-fetch-site']),
    allowed: ownOrigins(String(config.appUrl ?? ''), host, protocol),
  })
  if (refusal) throw forbidden(refusal)
})
