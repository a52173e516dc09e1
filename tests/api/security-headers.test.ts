/**
 * Response security headers (nuxt-security, configured in nuxt.config.ts `security`, plus
 * server/plugins/security-headers.ts for what depends on the app URL):
 * - a page: a Content-Security-Policy with a fresh nonce that Nuxt's scripts carry, frames only
 *   from ourselves, X-Frame-Options, nosniff, Referrer-Policy, Permissions-Policy, COOP; no HSTS
 *   over plain http; no X-Powered-By;
 * - an API answer (success and error): nosniff, X-Frame-Options, Referrer-Policy;
 * - request size ceilings above every route's own limit (a 19 MB attachment and a 3 MB import
 *   reach their routes), and no HTML filter that refuses ordinary text ("Ne < 50");
 * - served as https (NUXT_APP_URL=https://…): HSTS on pages and API answers,
 *   upgrade-insecure-requests, and an external tile server allowed in img-src.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { ATTACHMENT_MAX_BYTES } from '../../shared/schemas/attachments'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { expectErrorAnswer } from './auth-support'
import { demoRecords, uploadForm } from './genotypes-support'

const server = useServer()
let biologist: ApiClient

beforeAll(async () => {
  biologist = await server.signIn(demo.biologist)
})

/** The CSP header as directive → sources. */
function cspOf(headers: Headers): Map<string, string[]> {
  const value = headers.get('content-security-policy') ?? ''
  return new Map(value.split(';').map(part => part.trim()).filter(Boolean).map((part) => {
    const [name, ...sources] = part.split(/\s+/)
    return [name!, sources]
  }))
}

async function page(path: string): Promise<{ status: number, headers: Headers, html: string }> {
  const response = await fetch(new URL(path, server.url), { redirect: 'manual' })
  return { status: response.status, headers: response.headers, html: await response.text() }
}

describe('headers on a page', () => {
  it('sends a nonce-based CSP that Nuxt\'s own scripts carry', async () => {
    const { status, headers, html } = await page('/login')
    expect(status).toBe(200)
    const csp = cspOf(headers)
    const nonce = /'nonce-([^']+)'/.exec(csp.get('script-src')?.join(' ') ?? '')?.[1]
    expect(nonce).toMatch(/^[\w+/=-]{16,}$/)
    expect(csp.get('script-src')).toEqual(expect.arrayContaining(['\'self\'', '\'strict-dynamic\'']))
    expect(csp.get('script-src')).not.toContain('\'unsafe-eval\'')
    expect(csp.get('object-src')).toEqual(['\'none\''])
    expect(csp.get('base-uri')).toEqual(['\'none\''])
    expect(csp.get('frame-ancestors')).toEqual(['\'self\''])
    expect(csp.get('img-src')).toEqual(expect.arrayContaining(['\'self\'', 'data:', 'blob:']))
    expect(csp.get('worker-src')).toContain('\'self\'')
    expect(csp.has('upgrade-insecure-requests')).toBe(false)
    // Every script element in the page carries this response's nonce.
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map(m => m[0])
    expect(scripts.length).toBeGreaterThan(0)
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`)
    // A new nonce for each answer.
    const again = cspOf((await page('/login')).headers).get('script-src')?.join(' ')
    expect(again).not.toContain(nonce)
  })

  it('sends the framing, sniffing, referrer, permissions and opener headers; no HSTS over http', async () => {
    const { headers } = await page('/login')
    expect(headers.get('x-frame-options')).toBe('SAMEORIGIN')
    expect(headers.get('x-content-type-options')).toBe('nosniff')
    expect(headers.get('referrer-policy')).toBe('same-origin')
    expect(headers.get('cross-origin-opener-policy')).toBe('same-origin')
    expect(headers.get('permissions-policy')).toMatch(/camera=\(\)/)
    expect(headers.get('permissions-policy')).toMatch(/geolocation=\(\)/)
    expect(headers.get('permissions-policy')).toMatch(/microphone=\(\)/)
    expect(headers.get('strict-transport-security')).toBeNull()
    expect(headers.get('x-powered-by')).toBeNull()
  })
})

describe('headers on API answers', () => {
  it('sends nosniff, X-Frame-Options and Referrer-Policy on success and on error answers', async () => {
    for (const response of [await biologist.get('/api/me'), await server.anonymous().get('/api/me'), await biologist.get('/api/proposals/2000000000')]) {
      expect(response.headers.get('x-content-type-options')).toBe('nosniff')
      expect(response.headers.get('x-frame-options')).toBe('SAMEORIGIN')
      expect(response.headers.get('referrer-policy')).toBe('same-origin')
      expect(response.headers.get('strict-transport-security')).toBeNull()
      expect(response.headers.get('x-powered-by')).toBeNull()
    }
  })

  it('answers no CORS preflight for another site', async () => {
    const response = await fetch(new URL('/api/me', server.url), {
      method: 'OPTIONS', headers: { 'origin': 'https://elsewhere.example', 'access-control-request-method': 'PATCH' },
    })
    expect(response.headers.get('access-control-allow-origin')).toBeNull()
  })
})

describe('request limits and input filtering', () => {
  it('lets a 19 MB attachment through to the route (below its 20 MB limit); over it, a plain 413', async () => {
    const { subpopulations } = await demoRecords(server)
    const path = `/api/subpopulations/${subpopulations['Cinderbrook Cove']}/attachments`
    const big = new Uint8Array(ATTACHMENT_MAX_BYTES - 1024 * 1024)
    big.set(new TextEncoder().encode('%PDF-1.4\n'))
    const stored = await uploadForm(biologist, path, { name: 'large-survey.pdf', content: big })
    expect(stored.status, JSON.stringify(stored.body)).toBe(201)
    expect(stored.body.sizeBytes).toBe(big.length)
    // Just over the limit: the route's own answer.
    const over = new Uint8Array(ATTACHMENT_MAX_BYTES + 10)
    over.set(new TextEncoder().encode('%PDF-1.4\n'))
    expectErrorAnswer(await uploadForm(biologist, path, { name: 'too-large.pdf', content: over }), 413, /The file is too large\. The limit is 20 MB\./)
    // Far over every limit: the app-wide ceiling answers before any route, as plainly.
    const huge = new Uint8Array(ATTACHMENT_MAX_BYTES + 1024 * 1024)
    huge.set(new TextEncoder().encode('%PDF-1.4\n'))
    expectErrorAnswer(await uploadForm(biologist, path, { name: 'huge.pdf', content: huge }), 413, /^The request is too large\. Files can be at most 20 MB/)
  })

  it('lets a 3 MB import body through to the route (its own limit is 5 MB)', async () => {
    const { speciesId } = await demoRecords(server)
    const text = `name,latitude,longitude\n${'x'.repeat(3 * 1024 * 1024)}\n`
    const response = await biologist.post(`/api/species/${speciesId}/subpopulations/import`, { format: 'csv', text })
    // The route read it and judged the rows (422), rather than a blanket 413 in front of it.
    expect(response.status, JSON.stringify(response.body).slice(0, 300)).toBe(422)
  })

  it('accepts ordinary text with "<" and ">" (no HTML filter in front of the routes)', async () => {
    const proposal = await biologist.post('/api/proposals', { title: 'Ne < 50 for > 3 generations', recipientId: (await demoRecords(server)).subpopulations['Cinderbrook Cove'] })
    expect(proposal.status, JSON.stringify(proposal.body)).toBe(201)
    expect(proposal.body.proposal.title).toBe('Ne < 50 for > 3 generations')
  })
})

describe('served over https', () => {
  it('adds HSTS to pages and API answers, upgrade-insecure-requests, and the tile server to img-src', async () => {
    await server.restart({ NUXT_APP_URL: 'https://tributary.example', NUXT_PUBLIC_TILE_URL: 'https://{s}.tiles.example.org/{z}/{x}/{y}.png' })
    const { headers } = await page('/login')
    expect(headers.get('strict-transport-security')).toBe('max-age=31536000; includeSubDomains')
    const csp = cspOf(headers)
    expect(csp.has('upgrade-insecure-requests')).toBe(true)
    expect(csp.get('img-src')).toContain('https://*.tiles.example.org')
    const api = await server.anonymous().get('/api/health')
    expect(api.headers.get('strict-transport-security')).toBe('max-age=31536000; includeSubDomains')
  })
})
