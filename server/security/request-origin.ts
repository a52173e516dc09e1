/**
 * Where a state-changing request came from, judged by the headers browsers send on their own
 * (server/middleware/csrf.ts applies it to POST, PUT, PATCH and DELETE under /api).
 *
 * - `Sec-Fetch-Site: cross-site` → refused.
 * - Otherwise `Origin`, when present, must be one of the app's own origins ('null' is refused).
 * - Without `Origin`, `Referer`, when present, must point at one of them.
 * - With none of these headers the request passes: browsers always send Origin on cross-origin
 *   POST/PUT/PATCH/DELETE, so such a request comes from a non-browser client (curl, scripts,
 *   the tests), which carries no victim's cookie. The session cookie is SameSite=Lax as well.
 * Pure functions: the middleware gathers the headers and settings.
 */

/** The headers and settings the decision needs. */
export interface OriginEvidence {
  origin?: string
  referer?: string
  secFetchSite?: string
  /** Origins the app answers on (see ownOrigins). */
  allowed: readonly string[]
}

/** 'https://Example.org:443/x' → 'https://example.org'; null when it is not an http(s) URL. */
export function originOf(url: string): string | null {
  try {
    const parsed = new URL(url)
    if (parsed.protocol !== 'http:' && parsed.protocol !== 'https:') return null
    return parsed.origin
  } catch {
    return null
  }
}

/**
 * The origins the app answers on: the configured app URL, and the origin this request was
 * addressed to (its Host header, and behind a trusted proxy X-Forwarded-Host/-Proto).
 *
 * @param appUrl - runtimeConfig.appUrl
 * @param host - the Host header (or X-Forwarded-Host when the proxy is trusted)
 * @param protocol - 'http' or 'https' as the client used it
 */
export function ownOrigins(appUrl: string, host: string | undefined, protocol: string): string[] {
  const origins = new Set<string>()
  const configured = originOf(appUrl)
  if (configured) origins.add(configured)
  if (host) {
    const addressed = originOf(`${protocol}://${host}`)
    if (addressed) origins.add(addressed)
  }
  return [...origins]
}

/**
 * Why the request must be refused as cross-site, or null when it may pass.
 *
 * @example crossSiteRefusal({ origin: 'https://evil.example', allowed: ['https://app.example'] }) // 'This request came from another site …'
 * @example crossSiteRefusal({ allowed: ['https://app.example'] }) // null (no browser headers)
 */
export function crossSiteRefusal(evidence: OriginEvidence): string | null {
  const home = evidence.allowed[0] ?? 'its own address'
  const refuse = (from: string) => `This request came from another site (${from}), so it was refused. Changes are accepted only from Tributary's own pages at ${home}.`
  if (evidence.secFetchSite?.toLowerCase() === 'cross-site') return refuse(evidence.origin ?? originOf(evidence.referer ?? '') ?? 'an unknown site')
  if (evidence.origin !== undefined) {
    const origin = originOf(evidence.origin)
    if (!origin || !evidence.allowed.includes(origin)) return refuse(evidence.origin)
    return null
  }
  if (evidence.referer !== undefined) {
    const origin = originOf(evidence.referer)
    if (!origin || !evidence.allowed.includes(origin)) return refuse(origin ?? 'an unknown page')
  }
  return null
}
