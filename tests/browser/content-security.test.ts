/**
 * The Content-Security-Policy against the real pages in Chromium: the main pages, signed in as
 * the demo administrator, load, hydrate (Vue mounted, the page reacts) and report no CSP
 * violation — the Atlas map (Leaflet and geoman styles, the basemap served by the app), charts
 * (ECharts), the brief preview (our PDF in an iframe), the exact-chain worker, fonts. Violations
 * are caught with the `securitypolicyviolation` event and from the console.
 */
import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { useBrowser } from '../support/browser'
import { demo, useServer } from '../support/server'

const server = useServer()
const browser = useBrowser()

/** Starts recording CSP violations in `page` (before any of its scripts run). */
async function recordViolations(page: Page): Promise<() => Promise<string[]>> {
  const fromConsole: string[] = []
  page.on('console', (message) => {
    if (/Content[- ]Security[- ]Policy/i.test(message.text())) fromConsole.push(message.text())
  })
  // A blocked image, font, frame or worker shows up as a failed request too.
  page.on('requestfailed', (request) => {
    const reason = request.failure()?.errorText ?? ''
    if (/blocked/i.test(reason)) fromConsole.push(`${request.url()} failed: ${reason}`)
  })
  await page.addInitScript(() => {
    const list: string[] = []
    ;(window as unknown as { cspViolations: string[] }).cspViolations = list
    document.addEventListener('securitypolicyviolation', (event) => {
      list.push(`${event.violatedDirective} blocked ${event.blockedURI || '(inline)'} at ${event.sourceFile}:${event.lineNumber}`)
    })
  })
  return async () => [...fromConsole, ...await page.evaluate(() => (window as unknown as { cspViolations?: string[] }).cspViolations ?? [])]
}

/** True once Vue has mounted the app on the server-rendered markup (waits up to 20 s for it). */
async function hydrated(page: Page): Promise<boolean> {
  const mounted = () => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__)
  return page.waitForFunction(mounted, undefined, { timeout: 20_000 }).then(() => true, () => false)
}

async function ids(): Promise<{ subpopulation: number, approved: number, draft: number }> {
  const one = async (sql: string) => (await server.db.query<{ id: number }>(sql)).rows[0]!.id // the demo seed has these rows
  return {
    subpopulation: await one(`SELECT id FROM subpopulations WHERE name = 'Fernwhistle Creek'`),
    approved: await one(`SELECT id FROM proposals WHERE status = 'approved' ORDER BY id LIMIT 1`),
    draft: await one(`SELECT id FROM proposals WHERE status = 'draft' ORDER BY id LIMIT 1`),
  }
}

describe('Content-Security-Policy in the browser', () => {
  it('the sign-in page hydrates with no violation', async () => {
    const page = await browser.newPage()
    const violations = await recordViolations(page)
    await page.goto(`${server.url}/login`)
    await page.getByRole('heading', { level: 1, name: 'Sign in', exact: true }).waitFor()
    expect(await hydrated(page)).toBe(true)
    await page.getByLabel('E-mail address').fill(demo.admin)
    expect(await violations()).toEqual([])
  })

  it('the main pages load, hydrate and report no violation', { timeout: 180_000 }, async () => {
    const records = await ids()
    const page = await browser.signedInPage(server.url, demo.admin)
    const violations = await recordViolations(page)
    const paths = [
      '/', `/subpopulations/${records.subpopulation}`,
      '/proposals', `/proposals/${records.draft}`, `/proposals/${records.approved}`, `/proposals/${records.draft}/compare`,
      '/reviews', `/reviews/${records.approved}`, '/admin', '/admin/users', '/admin/agency', '/admin/audit', '/admin/outbox',
      '/account', '/verify',
    ]
    for (const path of paths) {
      const response = await page.goto(`${server.url}${path}`, { waitUntil: 'networkidle' })
      expect(response?.status(), path).toBeLessThan(400)
      expect(await hydrated(page), path).toBe(true)
      expect(await violations(), path).toEqual([])
    }
  })

  it('draws the Atlas map with its basemap and styles', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    const violations = await recordViolations(page)
    await page.goto(server.url)
    await page.locator('.atlas-map[data-ready="true"]').waitFor({ timeout: 20_000 })
    // Leaflet's own stylesheet applied (positioned panes), the basemap and shapes drawn on canvases.
    expect(await page.locator('.leaflet-pane').first().evaluate(element => getComputedStyle(element).position)).toBe('absolute')
    expect(await page.locator('.atlas-map canvas').count()).toBeGreaterThan(0)
    expect(await violations()).toEqual([])
  })

  it('shows the brief preview (our PDF in a frame)', async () => {
    const records = await ids()
    const page = await browser.signedInPage(server.url, demo.admin)
    const violations = await recordViolations(page)
    await page.goto(`${server.url}/proposals/${records.approved}`, { waitUntil: 'networkidle' })
    const toggle = page.getByRole('button', { name: /^(Show|Hide) the preview$/ })
    if ((await toggle.innerText()).startsWith('Show')) await toggle.click()
    const frame = page.locator('iframe[title*="brief" i]')
    await frame.waitFor()
    await page.waitForLoadState('networkidle')
    expect(await violations()).toEqual([])
  })
})
