/**
 * server/security/request-origin.ts: which state-changing requests count as cross-site
 * (server/middleware/csrf.ts refuses them with 403). Expected values: the rules as documented
 * in that file (common practice for Origin/Referer checking, no source).
 */
import { describe, expect, it } from 'vitest'
import { crossSiteRefusal, originOf, ownOrigins } from '../../../server/security/request-origin'

const allowed = ownOrigins('https://tributary.example', 'tributary.example', 'https')

describe('originOf and ownOrigins', () => {
  it('reduces URLs to scheme, host and a non-default port', () => {
    expect(originOf('https://Tributary.Example:443/atlas?x=1')).toBe('https://tributary.example')
    expect(originOf('http://127.0.0.1:3000/')).toBe('http://127.0.0.1:3000')
    expect(originOf('javascript:alert(1)')).toBeNull()
    expect(originOf('not a url')).toBeNull()
  })

  it('lists the configured app URL and the addressed host once each', () => {
    expect(allowed).toEqual(['https://tributary.example'])
    expect(ownOrigins('http://localhost:3000', '127.0.0.1:3000', 'http')).toEqual(['http://localhost:3000', 'http://127.0.0.1:3000'])
    expect(ownOrigins('', undefined, 'http')).toEqual([])
  })
})

describe('crossSiteRefusal', () => {
  it('lets through the app\'s own origin, a same-origin Referer, and requests without browser headers', () => {
    expect(crossSiteRefusal({ origin: 'https://tributary.example', allowed })).toBeNull()
    expect(crossSiteRefusal({ origin: 'https://tributary.example', secFetchSite: 'same-origin', allowed })).toBeNull()
    expect(crossSiteRefusal({ referer: 'https://tributary.example/proposals/3', allowed })).toBeNull()
    expect(crossSiteRefusal({ allowed })).toBeNull()
    expect(crossSiteRefusal({ secFetchSite: 'none', allowed })).toBeNull()
  })

  it('refuses another origin, another port or scheme, Origin: null, a foreign Referer and Sec-Fetch-Site: cross-site', () => {
    for (const evidence of [
      { origin: 'https://elsewhere.example' },
      { origin: 'https://tributary.example:8443' },
      { origin: 'http://tributary.example' },
      { origin: 'https://tributary.example.elsewhere.example' },
      { origin: 'null' },
      { referer: 'https://elsewhere.example/page' },
      { referer: 'garbage' },
      { secFetchSite: 'cross-site' },
      { secFetchSite: 'Cross-Site', origin: 'https://tributary.example' },
      { origin: 'https://elsewhere.example', referer: 'https://tributary.example/' },
    ]) {
      expect(crossSiteRefusal({ ...evidence, allowed }), JSON.stringify(evidence)).toMatch(/^This request came from another site \(.+\), so it was refused\. Changes are accepted only from Tributary's own pages at https:\/\/tributary\.example\.$/)
    }
  })

  it('names the foreign origin', () => {
    expect(crossSiteRefusal({ origin: 'https://elsewhere.example', allowed })).toContain('(https://elsewhere.example)')
    expect(crossSiteRefusal({ referer: 'https://elsewhere.example/a/b', allowed })).toContain('(https://elsewhere.example)')
  })
})
