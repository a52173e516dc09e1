import { chromium } from 'playwright-core'
const base = process.env.BASE ?? 'http://127.0.0.1:3456'
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] })
for (const [who, email] of [['biologist', 'biologist@demo.tributary.test'], ['manager', 'manager@demo.tributary.test'], ['viewer', 'viewer@demo.tributary.test']]) {
  const page = await browser.newPage({ viewport: { width: 1400, height: 900 } })
  const errors: string[] = []
  page.on('pageerror', e => errors.push(String(e)))
  page.on('response', r => { if (r.status() >= 400) errors.push(`${r.status()} ${r.url()}`) })
  await page.goto(`${base}/login`)
  await page.getByLabel(/e-mail/i).fill(email)
  await page.getByLabel(/password/i).fill('tributary-demo')
  await page.getByRole('button', { name: /sign in/i }).click()
  await page.waitForURL(u => !u.pathname.startsWith('/login'), { timeout: 15000 })
  await page.waitForLoadState('networkidle')
  await page.screenshot({ path: `/tmp/look/${who}-home.png` })
  await page.goto(`${base}/proposals`); await page.waitForLoadState('networkidle')
  const link = page.locator('a[href^="/proposals/"]').filter({ hasNotText: /new/i }).first()
  if (await link.count()) { await link.click(); await page.waitForLoadState('networkidle'); await page.waitForTimeout(1500) }
  await page.screenshot({ path: `/tmp/look/${who}-proposal.png` })
  console.log(who, page.url(), 'errors:', errors.join(' | ') || 'none')
  await page.close()
}
await browser.close()
