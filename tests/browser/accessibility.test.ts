/**
 * axe-core on the main pages, in a real browser (Debian's Chromium) against the built server, as
 * each role sees them: the public pages (sign-in and its error state, forgotten password, the
 * e-mailed reset and invitation pages and an unknown link, brief verification before and after a
 * check), the Atlas (map and list, a selected subpopulation, its distances and import dialogs), a
 * subpopulation record with its stacked sections and the census and census-import dialogs, the
 * genetic profile, proposals list, new proposal, the proposal workspace (results, a method
 * explanation open) and compare page, an approved proposal, the Reviews inbox and a review with
 * its decision form, the audit log and the administration pages (users, invite dialog, outbox
 * with an opened message). No page may have a "serious" or "critical" axe finding; a failure
 * lists each rule with its elements and axe's help. One browser and one signed-in page per role.
 */
import type { Page } from 'playwright-core'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBrowser } from '../support/browser'
import { describeViolations, seriousViolations } from '../support/axe'
import { demo, useServer } from '../support/server'
import { tokenFromMail } from '../api/auth-support'
import { getBytes } from '../api/brief-support'
import { createSubmitted, subpopulationId } from '../api/review-support'

const server = useServer()
const browser = useBrowser()

/** Fails with the rule ids, targets and help when the page (or `include`) has serious or critical findings. */
async function expectAccessible(page: Page, where: string, include?: string): Promise<void> {
  const findings = await seriousViolations(page, include)
  // Soft: one test goes on through its later page states, so a run lists every failing page.
  expect.soft(findings, describeViolations(findings, `on ${where}`)).toEqual([])
}

/** Waits until Vue has mounted the app on the server-rendered page (hydration done). */
async function hydrated(page: Page): Promise<void> {
  await page.waitForFunction(() => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__))
}

async function open(page: Page, path: string, heading: string | RegExp): Promise<void> {
  await page.goto(`${server.url}${path}`)
  await page.getByRole('heading', { level: 1, name: heading }).first().waitFor()
  await hydrated(page)
}

let records: { record: number, profile: number, draft: number, approved: number, submitted: number }

beforeAll(async () => {
  const proposals = await server.db.query<{ id: number, status: string }>('SELECT id, status FROM proposals ORDER BY id')
  const biologist = await server.signIn(demo.biologist)
  records = {
    record: await subpopulationId(server, 'Brackenveil Knob'),
    profile: await subpopulationId(server, 'Quillmoss Ridge'),
    draft: proposals.rows.find(row => row.status === 'draft')!.id,
    approved: proposals.rows.find(row => row.status === 'approved')!.id,
    submitted: await createSubmitted(server, biologist, 'Accessibility check of a submitted proposal'),
  }
})

describe('public pages', () => {
  let page: Page
  beforeAll(async () => {
    page = await browser.newPage()
  })

  it('sign-in, with and without its error message', async () => {
    await open(page, '/login', 'Sign in')
    await expectAccessible(page, 'the sign-in page')
    await page.getByLabel('E-mail address').fill('not-an-address')
    await page.getByRole('button', { name: 'Sign in', exact: true }).click()
    await page.getByText(/valid e-mail address/i).waitFor()
    await expectAccessible(page, 'the sign-in page with a field error')
    await page.getByLabel('E-mail address').fill(demo.viewer)
    await page.getByLabel('Password', { exact: true }).fill('not-the-password')
    await page.getByRole('button', { name: 'Sign in', exact: true }).click()
    await page.getByRole('alert').waitFor()
    await expectAccessible(page, 'the sign-in page after a refused sign-in')
  })

  it('forgotten password, the e-mailed reset and invitation links, and a used link', async () => {
    await open(page, '/forgot-password', /password/i)
    await expectAccessible(page, 'the forgotten-password page')

    const anonymous = server.anonymous()
    const asked = await anonymous.post('/api/auth/password/forgot', { email: demo.viewer })
    expect(asked.status, JSON.stringify(asked.body)).toBeLessThan(300)
    const reset = await tokenFromMail(server, demo.viewer, '/reset-password')
    await open(page, `/reset-password?token=${reset.token}`, /password/i)
    await expectAccessible(page, 'the reset-password page')

    const admin = await server.signIn(demo.admin)
    const invited = await admin.post('/api/admin/users', { email: 'tamsin.vale@demo.tributary.test', name: 'Tamsin Vale', role: 'viewer' })
    expect(invited.status, JSON.stringify(invited.body)).toBeLessThan(300)
    const invite = await tokenFromMail(server, 'tamsin.vale@demo.tributary.test', '/accept-invite')
    await open(page, `/accept-invite?token=${invite.token}`, /Join/)
    await expectAccessible(page, 'the accept-invitation page')

    await page.goto(`${server.url}/accept-invite?token=${'0'.repeat(43)}`)
    await page.getByText('We do not recognise this link').waitFor()
    await expectAccessible(page, 'an unknown invitation link')
  })

  it('brief verification, before and after checking a signed brief', async () => {
    await open(page, '/verify', 'Check a brief')
    await expectAccessible(page, 'the verify page')
    const viewer = await server.signIn(demo.viewer)
    const brief = await getBytes(viewer, `/api/proposals/${records.approved}/brief.pdf`)
    expect(brief.status).toBe(200)
    await page.locator('input[type="file"]').setInputFiles({ name: 'brief.pdf', mimeType: 'application/pdf', buffer: brief.bytes })
    await page.getByRole('button', { name: 'Check this file' }).click()
    await page.getByText('Valid: this is the brief as issued').waitFor()
    await expectAccessible(page, 'the verify page with a result')
  })
})

describe('the Atlas and subpopulation records (biologist)', () => {
  let page: Page
  beforeAll(async () => {
    page = await browser.signedInPage(server.url, demo.biologist)
  })

  it('the Atlas: map and list, then one subpopulation selected', async () => {
    await page.getByRole('heading', { level: 1, name: 'Atlas', exact: true }).waitFor()
    await page.locator('.atlas-map[data-ready="true"][data-drawn="10"]').waitFor({ timeout: 20_000 })
    await expectAccessible(page, 'the Atlas')
    await page.getByRole('list', { name: 'Subpopulations' }).getByRole('button', { name: /Quillmoss Ridge/ }).click()
    await page.getByRole('region', { name: 'Quillmoss Ridge' }).waitFor()
    await expectAccessible(page, 'the Atlas with a subpopulation card')
    for (const [button, dialog] of [['Distances', 'Distances'], ['Import', 'Import subpopulations']] as const) {
      await page.getByRole('toolbar', { name: 'Map tools' }).getByRole('button', { name: button, exact: true }).click()
      await page.getByRole('dialog', { name: dialog }).waitFor()
      await expectAccessible(page, `the Atlas ${dialog} dialog`)
      await page.keyboard.press('Escape')
      await page.getByRole('dialog').waitFor({ state: 'detached' })
    }
  })

  it('a subpopulation record with all its sections, and the census dialog', async () => {
    await open(page, `/subpopulations/${records.record}`, 'Brackenveil Knob')
    await page.locator('figure svg').first().waitFor()
    await expectAccessible(page, 'a subpopulation record')
    await page.getByRole('button', { name: 'Add a year' }).click()
    await page.getByRole('dialog', { name: 'Add a census year' }).waitFor()
    await expectAccessible(page, 'the census dialog')
    await page.keyboard.press('Escape')
    await page.getByRole('dialog').waitFor({ state: 'detached' })
    await page.getByRole('button', { name: 'Import CSV' }).click()
    await page.getByRole('dialog', { name: 'Import census years into Brackenveil Knob' }).waitFor()
    await expectAccessible(page, 'the census import dialog')
    await page.keyboard.press('Escape')
  })

  it('the genetic profile with demo genotype data', async () => {
    await open(page, `/subpopulations/${records.profile}#genetic-profile`, 'Quillmoss Ridge')
    await page.getByRole('region', { name: 'Genotype datasets' }).locator('tbody tr').first().waitFor()
    await expectAccessible(page, 'the genetic profile', '#genetic-profile')
  })
})

describe('proposals (biologist)', () => {
  let page: Page
  beforeAll(async () => {
    page = await browser.signedInPage(server.url, demo.biologist)
  })

  it('the proposals list and the new-proposal form', async () => {
    await open(page, '/proposals', 'Proposals')
    await expectAccessible(page, 'the proposals list')
    await open(page, '/proposals/new', /proposal/i)
    await page.waitForFunction(() => document.querySelectorAll('select option').length > 2)
    await expectAccessible(page, 'the new-proposal form')
  })

  it('the workspace with live results, and the compare page', async () => {
    await open(page, `/proposals/${records.draft}`, /.+/)
    await page.getByTestId('establishment-figure').first().and(page.locator('[data-value]')).waitFor()
    await expectAccessible(page, 'the proposal workspace')
    await page.locator('[data-explain="establishment.haldane"]').first().click()
    await page.getByRole('region', { name: '"2hs" rule of thumb' }).waitFor()
    await expectAccessible(page, 'the workspace with a method explanation open')
    await page.keyboard.press('Escape')
    await page.goto(`${server.url}/proposals/${records.draft}/compare`)
    await page.getByTestId('compare-table').waitFor()
    await hydrated(page)
    await expectAccessible(page, 'the compare page')
  })

  it('an approved proposal with its monitoring', async () => {
    await open(page, `/proposals/${records.approved}`, /.+/)
    await expectAccessible(page, 'an approved proposal')
  })
})

describe('reviews (manager)', () => {
  let page: Page
  beforeAll(async () => {
    page = await browser.signedInPage(server.url, demo.manager)
  })

  it('the inbox and a review with its decision form', async () => {
    await open(page, '/reviews', 'Reviews')
    await page.locator(`tr[data-proposal-id="${records.submitted}"]`).waitFor()
    await expectAccessible(page, 'the Reviews inbox')
    await open(page, `/reviews/${records.submitted}`, 'Accessibility check of a submitted proposal')
    await page.getByRole('form', { name: 'Decision' }).waitFor()
    await expectAccessible(page, 'a review with its decision form')
    await open(page, `/reviews/${records.approved}`, /.+/)
    await page.getByRole('list', { name: 'Timeline' }).waitFor()
    await expectAccessible(page, 'a decided review with monitoring')
  })
})

describe('administration (administrator)', () => {
  let page: Page
  beforeAll(async () => {
    page = await browser.signedInPage(server.url, demo.admin)
  })

  it('overview, audit log, agency profile and account', async () => {
    await open(page, '/admin', 'Overview')
    await expectAccessible(page, 'the administration overview')
    await open(page, '/admin/audit', 'Audit log')
    await expectAccessible(page, 'the audit log')
    await open(page, '/admin/agency', 'Agency profile')
    await expectAccessible(page, 'the agency profile')
    await open(page, '/account', /.+/)
    await expectAccessible(page, 'the account page')
  })

  it('users with the invite dialog, and the outbox with an opened message', async () => {
    await open(page, '/admin/users', /Users|People/)
    await expectAccessible(page, 'the users page')
    await page.getByRole('button', { name: 'Invite a person' }).click()
    await page.getByRole('dialog', { name: 'Invite a person' }).waitFor()
    await expectAccessible(page, 'the invite dialog')
    await page.keyboard.press('Escape')
    await page.getByRole('dialog').waitFor({ state: 'detached' })
    const actions = page.getByRole('button', { name: /actions for /i }).first()
    await actions.click()
    await page.getByRole('menu').waitFor()
    await expectAccessible(page, 'the user actions menu')
    await page.keyboard.press('Escape')

    await open(page, '/admin/outbox', 'Outbox')
    const message = page.getByRole('main').locator('button[aria-controls]').first()
    await message.click()
    await expect.poll(() => message.getAttribute('aria-expanded')).toBe('true')
    await expectAccessible(page, 'the outbox with an opened message')
  })
})
