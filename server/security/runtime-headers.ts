/**
 * The parts of the security headers that depend on run-time settings (NUXT_APP_URL,
 * NUXT_PUBLIC_TILE_URL), applied by server/plugins/security-headers.ts. Pure functions.
 */

/** Strict-Transport-Security sent when the app is served over https: one year, subdomains too. */
export const HSTS_VALUE = 'max-age=31536000; includeSubDomains'

/** True when the app's URL is https (then HSTS and upgrade-insecure-requests are sent). */
export function servesHttps(appUrl: string): boolean {
  return /^https:\/\//i.test(appUrl.trim())
}

/**
 * The CSP source for a Leaflet tile URL template, or null when the tiles come from the app
 * itself (a relative URL) or the template is unusable. Placeholders in the host name
 * ('{s}.tile.example.org') become a wildcard.
 *
 * @example tileImageSource('https://{s}.tiles.example.org/{z}/{x}/{y}.png') // 'https://*.tiles.example.org'
 * @example tileImageSource('/tiles/{z}/{x}/{y}.png') // null
 */
export function tileImageSource(tileUrl: string): string | null {
  const match = /^(https?):\/\/([^/?#]+)/i.exec(tileUrl.trim())
  if (!match) return null
  const [, scheme, host] = match as unknown as [string, string, string]
  const wildHost = host.replace(/\{[^}]*\}/g, '*')
  if (!/^[\w.*:-]+$/.test(wildHost)) return null
  return `${scheme.toLowerCase()}://${wildHost.toLowerCase()}`
}
