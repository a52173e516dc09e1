/**
 * Debian's Chromium through playwright-core for browser tests (never a downloaded browser).
 *
 *   const server = useServer(); const browser = useBrowser()
 *   const page = await browser.newPage(); await page.goto(server.url + '/login')
 */
import { afterAll, beforeAll } from 'vitest'
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core'

export const chromiumArgs = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
]

export function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: chromiumArgs })
}

export interface BrowserHandle {
  newPage(options?: { width?: number, height?: number }): Promise<Page>
  /** A page signed in through the real sign-in form. */
  signedInPage(baseUrl: string, email: string, password?: string): Promise<Page>
}

export function useBrowser(): BrowserHandle {
  let browser: Browser | undefined
  const contexts: BrowserContext[] = []
  beforeAll(async () => {
    browser = await launchChromium()
  })
  afterAll(async () => {
    for (const context of contexts) await context.close().catch(() => {})
    await browser?.close()
  })
  const handle: BrowserHandle = {
    async newPage({ width = 1280, height = 800 } = {}) {
      const context = await browser!.newContext({ viewport: { width, height } })
      contexts.push(context)
      return context.newPage()
    },
    async signedInPage(baseUrl, email, password = 'tributary-demo') {
      const page = await handle.newPage()
      await page.goto(`${baseUrl}/login`)
      await page.getByLabel(/e-?mail/i).fill(email)
      await page.getByLabel(/password/i).fill(password)
      await page.getByRole('button', { name: /sign in/i }).click()
      await page.waitForURL(url => !url.pathname.startsWith('/login'))
      return page
    },
  }
  return handle
}
