/**
 * The app shell in a real browser (Debian's Chromium) against the built server: sign-in and
 * its failure message, what the top bar offers each demo role (Administration only for
 * administrators), sign-out, the redirect back after sign-in, the narrow-screen menu, the
 * keyboard behaviour of the user menu, and the administration pages (invite, stale-version
 * conflict, outbox body).
 */
import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { useBrowser } from '../support/browser'
import { demo, demoPassword, eventually, useServer } from '../support/server'
import { tokenFromMail } from '../api/auth-support'

const server = useServer()
const browser = useBrowser()

const roles = [
  { role: 'administrator', email: demo.admin, administration: true },
  { role: 'manager', email: demo.manager, administration: false },
  { role: 'biologist', email: demo.biologist, administration: false },
  { role: 'viewer', email: demo.viewer, administration: false },
] as const

/** Names of the links in the main navigation, in order. */
async function mainNavigation(page: Page): Promise<string[]> {
  const nav = page.getByRole('navigation', { name: 'Main' }).first()
  await nav.waitFor()
  return (await nav.getByRole('link').allInnerTexts()).map(text => text.trim())
}

/** Waits for the page's one <h1> to read `name` (pages render after the URL changes). */
async function waitForHeading(page: Page, name: string): Promise<void> {
  await page.getByRole('heading', { level: 1, name, exact: true }).waitFor()
}

async function signInThroughForm(page: Page, email: string, password: string): Promise<void> {
  await page.getByLabel('E-mail address').fill(email)
  await page.getByLabel('Password', { exact: true }).fill(password)
  await page.getByRole('button', { name: 'Sign in', exact: true }).click()
}

describe('sign-in page', () => {
  it('shows the form, the invented-data note and the demo sign-ins in demo mode', async () => {
    const page = await browser.newPage()
    await page.goto(`${server.url}/login`)
    await waitForHeading(page, 'Sign in')
    expect(await page.getByRole('note', { name: 'Demo workspace' }).innerText()).toMatch(/invented/i)
    expect(await page.getByRole('link', { name: 'Forgot your password?' }).getAttribute('href')).toBe('/forgot-password')
    const demoList = page.getByRole('region', { name: 'Demo sign-ins' })
    for (const email of Object.values(demo)) expect(await demoList.innerText()).toContain(email)
  })

  it('says why sign-in failed, stays on the page and clears the password', async () => {
    const page = await browser.newPage()
    await page.goto(`${server.url}/login`)
    await signInThroughForm(page, demo.biologist, 'not-the-password')
    const alert = page.getByRole('alert')
    await alert.waitFor()
    expect(await alert.innerText()).toMatch(/e-mail address or password is not correct/i)
    expect(new URL(page.url()).pathname).toBe('/login')
    expect(await page.getByLabel('Password', { exact: true }).inputValue()).toBe('')
  })

  it('checks the form before asking the server', async () => {
    const page = await browser.newPage()
    await page.goto(`${server.url}/login`)
    await signInThroughForm(page, 'not-an-address', 'x')
    await page.getByText(/valid e-mail address/i).waitFor()
    expect(await page.getByLabel('E-mail address').getAttribute('aria-invalid')).toBe('true')
  })

  it('fills the form from a demo sign-in and signs in', async () => {
    const page = await browser.newPage()
    await page.goto(`${server.url}/login`)
    await page.getByRole('button', { name: /use the viewer demo sign-in/i }).click()
    expect(await page.getByLabel('E-mail address').inputValue()).toBe(demo.viewer)
    expect(await page.getByLabel('Password', { exact: true }).inputValue()).toBe(demoPassword)
    await page.getByRole('button', { name: 'Sign in', exact: true }).click()
    await page.waitForURL(url => url.pathname === '/')
  })
})

describe('the shell for each role', () => {
  for (const { role, email, administration } of roles) {
    it(`${role}: Atlas, Proposals and Reviews${administration ? ' and Administration' : ', no Administration'}`, async () => {
      const page = await browser.signedInPage(server.url, email)
      expect(new URL(page.url()).pathname).toBe('/')
      await waitForHeading(page, 'Atlas')
      const links = await mainNavigation(page)
      expect(links).toEqual(administration
        ? ['Atlas', 'Proposals', 'Reviews', 'Administration']
        : ['Atlas', 'Proposals', 'Reviews'])
      // The agency name from GET /api/me sits in the top bar.
      await page.getByRole('banner').getByText('Eastern Uplands Wildlife Service').first().waitFor()
      // The user menu names the person and their role.
      await page.getByRole('button', { name: /^Account menu for / }).click()
      const menu = page.getByRole('menu')
      await menu.waitFor()
      expect(await menu.innerText()).toContain(email)
      expect((await menu.innerText()).toLowerCase()).toContain(role)
    })
  }

  it('a manager who opens an administration page directly gets a 403 page that says why', async () => {
    const page = await browser.signedInPage(server.url, demo.manager)
    const response = await page.goto(`${server.url}/admin/users`)
    expect(response?.status()).toBe(403)
    await waitForHeading(page, 'Administrators only')
  })

  it('a viewer reads that reviews are decided by managers and administrators', async () => {
    const page = await browser.signedInPage(server.url, demo.viewer)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reviews' }).click()
    await page.waitForURL(url => url.pathname === '/reviews')
    await page.getByText(/managers and administrators decide on proposals/i).waitFor()
  })
})

describe('signing out and back in', () => {
  it('signs out from the user menu; the Atlas then asks for sign-in again', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    await page.getByRole('button', { name: /^Account menu for / }).click()
    await page.getByRole('menuitem', { name: 'Sign out' }).click()
    await page.waitForURL(url => url.pathname === '/login')
    await page.getByText('You have signed out.').waitFor()
    await page.goto(`${server.url}/`)
    expect(new URL(page.url()).pathname).toBe('/login')
    await waitForHeading(page, 'Sign in')
  })

  it('returns to the page that asked for sign-in', async () => {
    const page = await browser.newPage()
    await page.goto(`${server.url}/admin/outbox`)
    const url = new URL(page.url())
    expect(url.pathname).toBe('/login')
    expect(url.searchParams.get('redirect')).toBe('/admin/outbox')
    await signInThroughForm(page, demo.admin, demoPassword)
    await page.waitForURL(next => next.pathname === '/admin/outbox')
    await waitForHeading(page, 'Outbox')
  })

  it('never follows a redirect to another site', async () => {
    const page = await browser.newPage()
    await page.goto(`${server.url}/login?redirect=//example.test/phish`)
    await signInThroughForm(page, demo.viewer, demoPassword)
    await page.waitForURL(url => url.pathname === '/')
    await waitForHeading(page, 'Atlas')
    expect(new URL(page.url()).host).toBe(new URL(server.url).host)
  })
})

describe('keyboard and narrow screens', () => {
  it('opens the user menu from the keyboard, moves with arrows, closes with Esc back on the button', async () => {
    const page = await browser.signedInPage(server.url, demo.manager)
    const trigger = page.getByRole('button', { name: /^Account menu for / })
    await trigger.focus()
    await page.keyboard.press('Enter')
    await page.getByRole('menu').waitFor()
    expect(await trigger.getAttribute('aria-expanded')).toBe('true')
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Account and password')
    await page.keyboard.press('ArrowDown')
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Sign out')
    await page.keyboard.press('Escape')
    await page.getByRole('menu').waitFor({ state: 'detached' })
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-haspopup'))).toBe('menu')
  })

  it('folds the navigation behind a Menu button at tablet width', async () => {
    const page = await browser.newPage({ width: 820, height: 1000 })
    await page.goto(`${server.url}/login`)
    await signInThroughForm(page, demo.admin, demoPassword)
    await page.waitForURL(url => url.pathname === '/')
    await waitForHeading(page, 'Atlas')
    const menuButton = page.getByRole('button', { name: 'Menu', exact: true })
    expect(await menuButton.getAttribute('aria-expanded')).toBe('false')
    expect(await page.getByRole('link', { name: 'Proposals' }).isVisible()).toBe(false)
    await menuButton.click()
    expect(await menuButton.getAttribute('aria-expanded')).toBe('true')
    await page.getByRole('link', { name: 'Administration' }).click()
    await page.waitForURL(url => url.pathname === '/admin')
    await waitForHeading(page, 'Overview')
    expect(await menuButton.getAttribute('aria-expanded')).toBe('false')
  })
})

describe('administration pages', () => {
  it('invites a person from the dialog; they appear as invited and the e-mail is in the Outbox', async () => {
    const page = await browser.signedInPage(server.url, demo.admin)
    await page.goto(`${server.url}/admin/users`)
    await page.getByRole('button', { name: 'Invite a person' }).click()
    const dialog = page.getByRole('dialog', { name: 'Invite a person' })
    await dialog.waitFor()
    // Focus starts inside the dialog, on the first field.
    expect(await page.evaluate(() => document.activeElement?.closest('[role="dialog"]') !== null)).toBe(true)
    await dialog.getByLabel('Name').fill('Wren Hollis')
    await dialog.getByLabel('E-mail address').fill('wren.hollis@demo.tributary.test')
    await dialog.getByLabel('Role').selectOption('manager')
    await page.getByRole('button', { name: 'Send invitation' }).click()
    await page.getByText(/Invitation e-mailed to wren\.hollis@demo\.tributary\.test/).waitFor()
    const row = page.locator('tr[data-user-email="wren.hollis@demo.tributary.test"]')
    expect(await row.innerText()).toMatch(/Manager[\s\S]*Invited/)

    await page.getByRole('link', { name: 'See the Outbox' }).click()
    await page.waitForURL(url => url.pathname === '/admin/outbox')
    const message = page.getByRole('button', { name: /invited you to Tributary[\s\S]*wren\.hollis@demo\.tributary\.test/ })
    await message.click()
    expect(await message.getAttribute('aria-expanded')).toBe('true')
    const bodyId = await message.getAttribute('aria-controls')
    const body = await page.locator(`[id="${bodyId}"]`).innerText()
    expect(body).toMatch(/\/accept-invite\?token=/)
  })

  it('asks for confirmation before deactivating, and explains a stale version (409)', async () => {
    const page = await browser.signedInPage(server.url, demo.admin)
    await page.goto(`${server.url}/admin/users`)
    const viewerRow = page.locator(`tr[data-user-email="${demo.viewer}"]`)
    await viewerRow.waitFor()
    const viewerName = (await viewerRow.locator('td').first().locator('span').first().innerText()).trim()
    // Someone else changes the viewer after this page loaded.
    await server.db.query('UPDATE users SET version = version + 1 WHERE email = $1', [demo.viewer])

    await page.getByRole('button', { name: `Actions for ${viewerName}` }).click()
    await page.getByRole('menuitem', { name: 'Deactivate…' }).click()
    const confirm = page.getByRole('alertdialog', { name: `Deactivate ${viewerName}?` })
    await confirm.waitFor()
    await confirm.getByRole('button', { name: 'Deactivate' }).click()
    await confirm.getByText('Someone else changed this user — reload to see their change.').waitFor()
    await confirm.getByRole('button', { name: 'Reload users' }).click()
    await confirm.waitFor({ state: 'detached' })

    // After the reload the same action goes through.
    await page.getByRole('button', { name: `Actions for ${viewerName}` }).click()
    await page.getByRole('menuitem', { name: 'Deactivate…' }).click()
    await page.getByRole('alertdialog').getByRole('button', { name: 'Deactivate' }).click()
    await page.getByText(`${viewerName} is deactivated and signed out.`).waitFor()
    const active = await eventually(async () => {
      const result = await server.db.query('SELECT active FROM users WHERE email = $1', [demo.viewer])
      return result.rows[0]?.active === false ? 'deactivated' : undefined
    })
    expect(active).toBe('deactivated')
  })

  it('has no actions on your own row', async () => {
    const page = await browser.signedInPage(server.url, demo.admin)
    await page.goto(`${server.url}/admin/users`)
    const ownRow = page.locator(`tr[data-user-email="${demo.admin}"]`)
    await ownRow.waitFor()
    expect(await ownRow.innerText()).toContain('You')
    expect(await ownRow.getByRole('button').count()).toBe(0)
  })
})

describe('e-mailed links and the account page', () => {
  const newcomer = { email: 'ash.morrow@demo.tributary.test', name: 'Ash Morrow', password: 'lichen over basalt steps' }

  it('accepts an invitation from the e-mailed link and arrives signed in', async () => {
    const admin = await server.signIn(demo.admin)
    const invited = await admin.post('/api/admin/users', { email: newcomer.email, name: 'A. Morrow', role: 'biologist' })
    expect(invited.status, JSON.stringify(invited.body)).toBeLessThan(300)
    const { token } = await tokenFromMail(server, newcomer.email, '/accept-invite')

    const page = await browser.newPage()
    await page.goto(`${server.url}/accept-invite?token=${token}`)
    await waitForHeading(page, 'Join Eastern Uplands Wildlife Service')
    expect(await page.getByLabel('Your name').inputValue()).toBe('A. Morrow')
    await page.getByLabel('Your name').fill(newcomer.name)
    await page.getByLabel('Choose a password').fill(newcomer.password)
    await page.getByLabel('Repeat the new password').fill('something else entirely')
    await page.getByRole('button', { name: 'Create my account' }).click()
    await page.getByText('The two passwords differ. Type the same password twice.').waitFor()
    await page.getByLabel('Repeat the new password').fill(newcomer.password)
    await page.getByRole('button', { name: 'Create my account' }).click()
    await page.waitForURL(url => url.pathname === '/')
    await waitForHeading(page, 'Atlas')
    await page.getByRole('button', { name: `Account menu for ${newcomer.name}` }).waitFor()

    // The same link does not work twice.
    const again = await browser.newPage()
    await again.goto(`${server.url}/accept-invite?token=${token}`)
    await again.getByText('This link has expired or was already used').waitFor()
  })

  it('changes the password on the account page; the old one stops working', async () => {
    const page = await browser.signedInPage(server.url, newcomer.email, newcomer.password)
    await page.goto(`${server.url}/account`)
    await waitForHeading(page, 'Your account')
    const form = page.getByRole('form', { name: 'Change password' })
    await form.getByLabel('Current password').fill('not my password at all')
    await form.getByLabel('New password', { exact: true }).fill('fern under cedar bark')
    await form.getByLabel('Repeat the new password').fill('fern under cedar bark')
    await page.getByRole('button', { name: 'Change password' }).click()
    await form.getByText('The current password is not correct.', { exact: true }).waitFor()
    expect(await form.getByRole('alert').first().innerText()).toMatch(/correct the highlighted fields/i)
    expect(await form.getByLabel('Current password').getAttribute('aria-invalid')).toBe('true')

    await form.getByLabel('Current password').fill(newcomer.password)
    await page.getByRole('button', { name: 'Change password' }).click()
    await page.getByText(/Your password has been changed/).waitFor()

    const old = await server.anonymous().post('/api/auth/login', { email: newcomer.email, password: newcomer.password })
    expect(old.status).toBe(401)
    const fresh = await server.anonymous().post('/api/auth/login', { email: newcomer.email, password: 'fern under cedar bark' })
    expect(fresh.status).toBe(200)
  })

  it('saves the agency profile, and explains a stale version (409)', async () => {
    const page = await browser.signedInPage(server.url, demo.admin)
    await page.goto(`${server.url}/admin/agency`)
    await waitForHeading(page, 'Agency profile')
    const phone = page.getByLabel(/^Phone/)
    await phone.fill('+1 555 0199')
    await page.getByRole('button', { name: 'Save profile' }).click()
    await page.getByText('The agency profile is saved.').waitFor()
    const saved = await server.db.query('SELECT phone FROM agencies WHERE short_name = $1', ['EUWS'])
    expect(saved.rows[0]?.phone).toBe('+1 555 0199')

    await server.db.query('UPDATE agencies SET version = version + 1 WHERE short_name = $1', ['EUWS'])
    await phone.fill('+1 555 0142')
    await page.getByRole('button', { name: 'Save profile' }).click()
    await page.getByText('Someone else changed the agency profile — reload to see their change.').waitFor()
  })
})
