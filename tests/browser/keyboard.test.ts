/**
 * Every main form completed with the keyboard alone, in a real browser (Debian's Chromium)
 * against the built server: sign-in, a new subpopulation placed on the map, a census year, a new
 * proposal and its scenario parameters, a review decision and an invitation. Only Tab,
 * Shift+Tab, Enter, Space, arrow keys, Escape and typing — no clicks. Each control reached shows
 * a visible focus indicator (tests/support/keyboard.ts); dialogs keep focus inside while open,
 * close on Escape and give focus back to the button that opened them. The results are checked in
 * the database.
 */
import type { Locator, Page } from 'playwright-core'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBrowser } from '../support/browser'
import { expectFocusRing, hasFocus, tabTo } from '../support/keyboard'
import { demo, demoPassword, eventually, useServer } from '../support/server'
import { createSubmitted } from '../api/review-support'

const server = useServer()
const browser = useBrowser()

/** Waits until Vue has mounted the app on the server-rendered page (hydration done). */
async function hydrated(page: Page): Promise<void> {
  await page.waitForFunction(() => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__))
}

async function open(page: Page, path: string): Promise<void> {
  await page.goto(`${server.url}${path}`)
  await hydrated(page)
}

/** Selects the field's whole text and types `text` over it. */
async function retype(page: Page, text: string): Promise<void> {
  await page.keyboard.press('ControlOrMeta+A')
  await page.keyboard.type(text)
}

/**
 * Presses Tab and then Shift+Tab `presses` times each inside an open dialog: focus never leaves
 * it (it wraps around), and Escape closes it and focus is back on `opener`.
 */
async function expectFocusTrappedThenEscape(page: Page, dialog: Locator, opener: Locator, presses = 12): Promise<void> {
  const insideDialog = () => dialog.evaluate(element => element.contains(document.activeElement))
  for (const key of ['Tab', 'Shift+Tab']) {
    for (let index = 0; index < presses; index++) {
      await page.keyboard.press(key)
      expect(await insideDialog(), `focus left the dialog after ${index + 1} × ${key}`).toBe(true)
    }
  }
  await page.keyboard.press('Escape')
  await dialog.waitFor({ state: 'detached' })
  await expect.poll(() => hasFocus(opener)).toBe(true)
  await expectFocusRing(page)
}

let submittedId: number
/** One signed-in biologist page for the record and proposal forms. */
let biologistPage: Page

beforeAll(async () => {
  const biologist = await server.signIn(demo.biologist)
  submittedId = await createSubmitted(server, biologist, 'Keyboard review of Cinderbrook Cove')
  biologistPage = await browser.signedInPage(server.url, demo.biologist)
})

describe('keyboard only', () => {
  it('signs in: Tab to each field, Shift+Tab back, Enter on the button', async () => {
    const page = await browser.newPage()
    await open(page, '/login')
    const email = page.getByLabel('E-mail address')
    const password = page.getByLabel('Password', { exact: true })
    await tabTo(page, email)
    await page.keyboard.type(demo.manager)
    await tabTo(page, password, { limit: 2 }) // past "Forgot your password?" beside its label
    await page.keyboard.type(demoPassword)
    await tabTo(page, email, { backwards: true, limit: 3 })
    expect(await email.inputValue()).toBe(demo.manager)
    await tabTo(page, page.getByRole('button', { name: 'Sign in', exact: true }))
    await page.keyboard.press('Enter')
    await page.waitForURL(url => url.pathname === '/')
    await page.getByRole('heading', { level: 1, name: 'Atlas', exact: true }).waitFor()
  })

  it('creates a subpopulation: New → Place a point, arrow keys move the map, Enter places it, the form is typed', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    const map = page.locator('.atlas-map')
    await expect.poll(async () => `${await map.getAttribute('data-ready')} ${await map.getAttribute('data-drawn')}`, { timeout: 45_000 }).toBe('true 10')
    const newButton = page.getByRole('button', { name: 'New subpopulation' })
    await tabTo(page, newButton)
    await page.keyboard.press('Enter')
    await page.getByRole('menu').waitFor()
    await page.keyboard.press('ArrowDown')
    expect(await hasFocus(page.getByRole('menuitem', { name: 'Place a point on the map' }))).toBe(true)
    await page.keyboard.press('Enter')

    const application = page.getByRole('application')
    await expect.poll(() => hasFocus(application)).toBe(true)
    await expectFocusRing(page)
    await page.getByTestId('map-centre-cross').waitFor()
    for (const key of ['ArrowLeft', 'ArrowUp']) {
      await page.keyboard.press(key)
      await page.locator('.atlas-map[data-moving="false"]').waitFor()
    }
    await page.keyboard.press('Enter')

    const dialog = page.getByRole('dialog', { name: 'New subpopulation' })
    await dialog.waitFor()
    expect(await hasFocus(dialog.getByLabel('Name'))).toBe(true)
    await expectFocusRing(page)
    await page.keyboard.type('Keyboard Hollow')
    await tabTo(page, dialog.getByLabel(/^Environment class/), { limit: 1 })
    await page.keyboard.type('talus slope (invented)')
    await tabTo(page, dialog.getByLabel('Generation time (years)'), { limit: 1 })
    await retype(page, '3')
    await tabTo(page, dialog.getByLabel(/^Years isolated/), { limit: 1 })
    await page.keyboard.type('15')
    await tabTo(page, dialog.getByRole('button', { name: 'Create subpopulation' }))
    await page.keyboard.press('Enter')
    await dialog.waitFor({ state: 'detached' })

    const row = await eventually(async () => (await server.db.query(
      `SELECT geometry->>'type' AS type, environment_class, generation_time_years, years_isolated FROM subpopulations WHERE name = 'Keyboard Hollow'`,
    )).rows[0])
    expect(row).toMatchObject({ type: 'Point', environment_class: 'talus slope (invented)', years_isolated: 15 })
    expect(Number(row.generation_time_years)).toBe(3)
  })

  it('adds a census year; the dialog traps focus, Escape closes it and focus returns', async () => {
    const record = (await server.db.query<{ id: number }>(`SELECT id FROM subpopulations WHERE name = 'Brackenveil Knob'`)).rows[0]!.id
    const page = biologistPage
    await open(page, `/subpopulations/${record}`)
    const addYear = page.getByRole('button', { name: 'Add a year' })
    await addYear.and(page.locator(':not([disabled])')).waitFor()
    await tabTo(page, addYear, { limit: 150 })
    await page.keyboard.press('Enter')
    const dialog = page.getByRole('dialog', { name: 'Add a census year' })
    await dialog.waitFor()
    expect(await hasFocus(dialog.getByLabel('Year'))).toBe(true)
    await expectFocusTrappedThenEscape(page, dialog, addYear)

    await page.keyboard.press('Space')
    await dialog.waitFor()
    expect(await dialog.getByLabel('Year').inputValue()).toBe('2025')
    await tabTo(page, dialog.getByLabel('Adults'), { limit: 1 })
    await page.keyboard.type('140')
    await tabTo(page, dialog.getByLabel(/^Males/), { limit: 1 })
    await page.keyboard.type('80')
    await tabTo(page, dialog.getByLabel(/^Females/), { limit: 1 })
    await page.keyboard.type('55')
    await page.keyboard.press('Enter')
    await page.getByText('The 2025 census was added.').waitFor()
    const stored = await server.db.query('SELECT adults, males, females FROM census_counts WHERE subpopulation_id = $1 AND year = 2025', [record])
    expect(stored.rows[0]).toEqual({ adults: 140, males: 80, females: 55 })
  })

  it('starts a proposal (select by typing, checkbox by Space) and sets scenario parameters', async () => {
    const page = biologistPage
    await open(page, '/proposals/new')
    await page.waitForFunction(() => document.querySelectorAll('select option').length > 2)
    const form = page.getByTestId('new-proposal-form')
    await tabTo(page, form.getByLabel('Recipient subpopulation'))
    await page.keyboard.type('Cinderbrook')
    await expect.poll(() => form.getByLabel('Title').inputValue()).toBe('Genetic rescue for Cinderbrook Cove')
    await tabTo(page, form.getByLabel(/^Purpose/))
    await page.keyboard.type('Keyboard test: restore gene flow (invented).')
    const source = form.getByRole('checkbox', { name: /Lanternmoss Gap/ })
    await tabTo(page, source)
    await page.keyboard.press('Space')
    expect(await source.isChecked()).toBe(true)
    await tabTo(page, page.getByTestId('create-proposal'))
    await page.keyboard.press('Enter')
    await page.waitForURL(url => /^\/proposals\/\d+$/.test(url.pathname))
    const proposalId = Number(new URL(page.url()).pathname.split('/').pop())
    await page.waitForFunction(() => [...document.querySelectorAll('button')].some(element => element.textContent?.includes('Version history') && !element.disabled))

    await tabTo(page, page.getByLabel('Females per release', { exact: true }), { limit: 150 })
    await retype(page, '7')
    await tabTo(page, page.getByLabel('Males per release', { exact: true }), { limit: 1 })
    await retype(page, '5')
    const scenario = await eventually(async () => {
      const rows = await server.db.query(`SELECT inputs FROM scenarios WHERE proposal_id = $1 AND NOT is_baseline`, [proposalId])
      const inputs = rows.rows[0]?.inputs
      return inputs?.schedule?.females === 7 && inputs?.schedule?.males === 5 ? inputs : undefined
    })
    expect(scenario.schedule).toMatchObject({ females: 7, males: 5 })
    const proposal = await server.db.query('SELECT title FROM proposals WHERE id = $1', [proposalId])
    expect(proposal.rows[0]?.title).toBe('Genetic rescue for Cinderbrook Cove')
  })

  it('records a review decision: radios by arrow keys, comment typed, Enter on the button', async () => {
    const page = await browser.signedInPage(server.url, demo.manager)
    await open(page, `/reviews/${submittedId}`)
    const decision = page.getByRole('form', { name: 'Decision' })
    await decision.getByRole('button', { name: 'Record decision' }).and(page.locator(':not([disabled])')).waitFor()
    await tabTo(page, decision.getByRole('radio', { name: /^Approve/ }), { limit: 150 })
    await page.keyboard.press('ArrowDown')
    expect(await decision.getByRole('radio', { name: /^Return for changes/ }).isChecked()).toBe(true)
    await page.keyboard.press('ArrowUp')
    expect(await decision.getByRole('radio', { name: /^Approve/ }).isChecked()).toBe(true)
    await tabTo(page, decision.getByLabel('Comment for the record'))
    await page.keyboard.type('Approved from the keyboard: schedule and screening are in place.')
    await tabTo(page, decision.getByRole('button', { name: 'Record decision' }))
    await page.keyboard.press('Enter')
    await page.getByTestId('latest-decision').waitFor()
    const stored = await eventually(async () => (await server.db.query(`SELECT status FROM proposals WHERE id = $1 AND status = 'approved'`, [submittedId])).rows[0])
    expect(stored.status).toBe('approved')
  })

  it('invites a person from the dialog; it traps focus, Escape closes it and focus returns', async () => {
    const page = await browser.signedInPage(server.url, demo.admin)
    await open(page, '/admin/users')
    const invite = page.getByRole('button', { name: 'Invite a person' })
    await invite.and(page.locator(':not([disabled])')).waitFor()
    await tabTo(page, invite)
    await page.keyboard.press('Enter')
    const dialog = page.getByRole('dialog', { name: 'Invite a person' })
    await dialog.waitFor()
    expect(await hasFocus(dialog.getByLabel('Name'))).toBe(true)
    await expectFocusRing(page)
    await expectFocusTrappedThenEscape(page, dialog, invite)

    await page.keyboard.press('Enter')
    await dialog.waitFor()
    await page.keyboard.type('Rowan Keys')
    await tabTo(page, dialog.getByLabel('E-mail address'), { limit: 1 })
    await page.keyboard.type('rowan.keys@demo.tributary.test')
    const role = dialog.getByLabel('Role')
    await tabTo(page, role, { limit: 1 })
    await page.keyboard.type('Manager')
    expect(await role.inputValue()).toBe('manager')
    await tabTo(page, dialog.getByRole('button', { name: 'Send invitation' }))
    await page.keyboard.press('Enter')
    await page.getByText(/Invitation e-mailed to rowan\.keys@demo\.tributary\.test/).waitFor()
    await dialog.waitFor({ state: 'detached' })
    await expect.poll(() => hasFocus(invite)).toBe(true)
    const stored = await server.db.query('SELECT role, active FROM users WHERE email = $1', ['rowan.keys@demo.tributary.test'])
    expect(stored.rows[0]?.role).toBe('manager')
  })
})
