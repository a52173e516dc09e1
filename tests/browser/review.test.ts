/**
 * Review in a real browser (Debian's Chromium) against the built server: a manager opens the
 * Reviews inbox, opens a submitted proposal, approves it with a comment and sees the decision on
 * the timeline (and the author gets the e-mail); a viewer reads a review and comments; an
 * administrator filters the audit log. Screenshots of each end state go to
 * $TRIBUTARY_SCREENSHOTS when that is set.
 */
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { Page } from 'playwright-core'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBrowser } from '../support/browser'
import { demo, useServer } from '../support/server'
import { createSubmitted, waitForMail } from '../api/review-support'

const server = useServer()
const browser = useBrowser()

let submittedId: number
const title = 'Browser review of Cinderbrook Cove'

async function screenshot(page: Page, name: string): Promise<void> {
  const directory = process.env.TRIBUTARY_SCREENSHOTS
  if (!directory) return
  mkdirSync(directory, { recursive: true })
  await page.screenshot({ path: join(directory, `${name}.png`), fullPage: true })
}

/** Waits until Vue has hydrated the page (buttons stay disabled until then). */
async function hydrated(page: Page, button: string): Promise<void> {
  await page.waitForFunction(name => [...document.querySelectorAll('button')].some(element => element.textContent?.includes(name) && !element.disabled), button)
}

beforeAll(async () => {
  const biologist = await server.signIn(demo.biologist)
  submittedId = await createSubmitted(server, biologist, title)
})

describe('a manager decides from the Reviews inbox', () => {
  it('opens the inbox, opens the submitted proposal, approves it with a comment and sees the timeline', async () => {
    const page = await browser.signedInPage(server.url, demo.manager)
    // Straight to the inbox: the Atlas (where sign-in lands) rewrites its own address while it loads.
    await page.goto(`${server.url}/reviews`)
    await page.getByRole('heading', { level: 1, name: 'Reviews' }).waitFor()
    const waiting = page.getByRole('region', { name: 'Waiting for your decision' })
    const row = waiting.locator(`tr[data-proposal-id="${submittedId}"]`)
    await row.waitFor()
    expect(await row.innerText()).toMatch(/Cinderbrook Cove[\s\S]*Robin Okafor[\s\S]*None chosen[\s\S]*less than an hour/)
    expect(await row.getByText('For your decision').isVisible()).toBe(true)
    await screenshot(page, 'review-inbox')

    await row.getByRole('link', { name: title }).click()
    await page.waitForURL(url => url.pathname === `/reviews/${submittedId}`)
    await page.getByRole('heading', { level: 1, name: title }).waitFor()
    await hydrated(page, 'Record decision')
    const decision = page.getByRole('form', { name: 'Decision' })
    // A decision needs a comment: the form says so before asking the server.
    await decision.getByRole('radio', { name: /Approve/ }).check()
    await decision.getByRole('button', { name: 'Record decision' }).click()
    await decision.getByText('Write a comment that explains the decision.').waitFor()

    await decision.getByLabel('Comment for the record').fill('Approved: modest schedule, screening in place.')
    await decision.getByRole('button', { name: 'Record decision' }).click()
    const latest = page.getByTestId('latest-decision')
    await latest.waitFor()
    expect(await latest.innerText()).toMatch(/Approved by Morgan Ellery[\s\S]*Approved: modest schedule, screening in place\./)
    await expect.poll(() => decision.count()).toBe(0)

    const timeline = page.getByRole('list', { name: 'Timeline' })
    const decided = timeline.locator('li[data-kind="decision"]')
    await decided.waitFor()
    expect(await decided.innerText()).toMatch(/Morgan Ellery approved the proposal[\s\S]*Approved: modest schedule, screening in place\./)
    expect((await timeline.locator('li').allInnerTexts()).map(text => text.trim())).toEqual([
      expect.stringMatching(/^Robin Okafor started this proposal/),
      expect.stringMatching(/^Robin Okafor submitted the proposal for review/),
      expect.stringMatching(/^Morgan Ellery approved the proposal/),
      expect.stringMatching(/^Morgan Ellery issued the signed brief \(document [0-9a-f-]{36}\)/),
    ])
    // The page reloaded the proposal: now approved, it shows its monitoring.
    await page.getByTestId('monitoring-panel').getByText('Awaiting translocation').waitFor()
    await screenshot(page, 'review-approved')

    const row2 = await server.db.query('SELECT status FROM proposals WHERE id = $1', [submittedId])
    expect(row2.rows[0].status).toBe('approved')
    const mail = await waitForMail(server, demo.biologist, new RegExp(`^Approved: ${title}$`))
    expect(mail.text).toContain('Approved: modest schedule, screening in place.')
  })
})

describe('others read reviews', () => {
  it('a viewer reads the review without a decision panel, and comments', async () => {
    const page = await browser.signedInPage(server.url, demo.viewer)
    await page.goto(`${server.url}/reviews/${submittedId}`)
    await page.getByRole('heading', { level: 1, name: title }).waitFor()
    await hydrated(page, 'Post comment')
    expect(await page.getByRole('form', { name: 'Decision' }).count()).toBe(0)
    await page.getByLabel('Add a comment').fill('When is the first release planned?')
    await page.getByRole('button', { name: 'Post comment' }).click()
    const comment = page.getByRole('list', { name: 'Timeline' }).locator('li[data-kind="comment"]')
    await comment.waitFor()
    expect(await comment.innerText()).toMatch(/Sasha Whitfield commented[\s\S]*When is the first release planned\?/)
    expect(await page.getByLabel('Add a comment').inputValue()).toBe('')
    await screenshot(page, 'review-viewer')
  })

  it('an administrator finds the decision in the audit log and filters it', async () => {
    const page = await browser.signedInPage(server.url, demo.admin)
    await page.goto(`${server.url}/admin`)
    await page.getByRole('navigation', { name: 'Administration' }).getByRole('link', { name: 'Audit log' }).click()
    await page.waitForURL(url => url.pathname === '/admin/audit')
    await page.getByRole('heading', { level: 1, name: 'Audit log' }).waitFor()
    await hydrated(page, 'Apply filters')
    await page.getByLabel('Action', { exact: true }).selectOption('proposal.approve')
    await page.getByRole('button', { name: 'Apply filters' }).click()
    await page.waitForURL(url => url.searchParams.get('action') === 'proposal.approve')
    const rows = page.locator('tr[data-audit-id]')
    await expect.poll(async () => (await rows.allInnerTexts()).every(text => text.includes('proposal.approve'))).toBe(true)
    const approvals = await server.db.query(`SELECT count(*)::int AS n FROM audit_events WHERE action = 'proposal.approve'`)
    expect(await rows.count()).toBe(approvals.rows[0].n)
    expect(await page.getByRole('link', { name: 'Export CSV' }).getAttribute('href')).toBe('/api/audit/export.csv?action=proposal.approve')
    await screenshot(page, 'audit-log')
  })
})
