/**
 * The proposal workspace in a real browser (Debian's Chromium) against the built server:
 * a biologist builds a proposal from the demo data (new → recipient → source → create), changes
 * inputs and sees the live results change (and saved), checks that the numbers on screen equal
 * the engine's for the same inputs, pins and compares two scenarios, picks the recommended
 * one, and meets a 409 conflict with its reload; a viewer reads only; the three columns stack
 * on a tablet. Screenshots go to $TRIBUTARY_SCREENSHOTS when that is set.
 */
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { Locator, Page } from 'playwright-core'
import { beforeAll, describe, expect, it } from 'vitest'
import { computeScenarioResults, formatProbability, resolveRecipient } from '#shared/proposals'
import type { ProposalDetailResponse } from '#shared/schemas/proposal'
import { useBrowser } from '../support/browser'
import { demo, useServer } from '../support/server'

const server = useServer()
const browser = useBrowser()

async function screenshot(page: Page, name: string): Promise<void> {
  const directory = process.env.TRIBUTARY_SCREENSHOTS
  if (!directory) return
  mkdirSync(directory, { recursive: true })
  await page.screenshot({ path: join(directory, `${name}.png`), fullPage: true })
}

/** Waits until Vue has hydrated the page (controls refuse input until then). */
async function hydrated(page: Page): Promise<void> {
  await page.waitForFunction(() => [...document.querySelectorAll('button')].some(element => element.textContent?.includes('Version history') && !element.disabled))
}

/** Polls until `read` gives something `accept` likes (results update after a short debounce). */
async function until<T>(read: () => Promise<T>, accept: (value: T) => boolean, timeout = 15_000): Promise<T> {
  const deadline = Date.now() + timeout
  let value = await read()
  while (!accept(value)) {
    if (Date.now() > deadline) throw new Error(`Timed out; last value ${JSON.stringify(value)}`)
    await new Promise(resolve => setTimeout(resolve, 100))
    value = await read()
  }
  return value
}

const figure = (page: Page): Locator => page.getByTestId('establishment-figure').first()
const saved = (page: Page) => until(() => page.getByTestId('save-state').getAttribute('data-state'), state => state === 'saved' || state === 'idle')

/** The demo recipient and source the biologist picks (invented demo data). */
const RECIPIENT = 'Cinderbrook Cove'
const SOURCE = 'Lanternmoss Gap'

let proposalId = 0

async function detail(id: number): Promise<ProposalDetailResponse> {
  const biologist = await server.signIn(demo.biologist)
  const answer = await biologist.get<ProposalDetailResponse>(`/api/proposals/${id}`)
  expect(answer.status).toBe(200)
  return answer.body
}

describe('a biologist builds a proposal from the demo data', () => {
  it('new → recipient → source → create opens the workspace with the baseline, a first scenario and live results', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    await page.goto(`${server.url}/proposals`)
    await page.getByTestId('new-proposal').click()
    await page.waitForURL(url => url.pathname === '/proposals/new')
    const form = page.getByTestId('new-proposal-form')
    await form.waitFor()
    await page.waitForFunction(() => document.querySelectorAll('select option').length > 2)
    const recipientSelect = form.getByLabel('Recipient subpopulation')
    const option = await recipientSelect.locator('option', { hasText: RECIPIENT }).getAttribute('value')
    await recipientSelect.selectOption(option!)
    expect(await form.getByLabel('Title').inputValue()).toBe(`Genetic rescue for ${RECIPIENT}`)
    await form.getByTestId('source-choices').getByText(SOURCE, { exact: true }).click()
    await form.getByLabel('Purpose').fill('Browser test: restore gene flow (invented).')
    await page.getByTestId('create-proposal').click()
    await page.waitForURL(url => /^\/proposals\/\d+$/.test(url.pathname))
    proposalId = Number(new URL(page.url()).pathname.split('/').pop())
    await hydrated(page)

    expect(await page.getByTestId('proposal-title').innerText()).toBe(`Genetic rescue for ${RECIPIENT}`)
    expect(await page.getByTestId('decision-support').first().innerText()).toMatch(/Results are decision support\. Agency policy, permits and licensed practice govern any translocation\./)
    const cards = page.locator('[data-testid^="scenario-card-"]')
    expect(await cards.count()).toBe(2)
    expect(await cards.first().innerText()).toMatch(/No action/)
    await until(() => figure(page).getAttribute('data-value'), value => value !== null)
    expect(await figure(page).innerText()).toMatch(/%$/)
    expect(await page.getByTestId('method-chip').first().innerText()).toMatch(/Exact chain|Diffusion/)
    await screenshot(page, 'proposal-workspace-1280')
  })

  it('changing inputs updates the results at once and saves them', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    await page.goto(`${server.url}/proposals/${proposalId}`)
    await hydrated(page)
    const before = await until(() => figure(page).getAttribute('data-value'), value => value !== null)
    const fWithBefore = await page.getByTestId('f-with').getAttribute('data-value')

    await page.getByLabel('Females per release', { exact: true }).fill('6')
    await page.getByLabel('Males per release', { exact: true }).fill('6')
    const after = await until(() => figure(page).getAttribute('data-value'), value => value !== null && value !== before)
    expect(Number(after)).toBeGreaterThan(Number(before))
    const fWithAfter = await until(() => page.getByTestId('f-with').getAttribute('data-value'), value => value !== fWithBefore)
    expect(Number(fWithAfter)).toBeLessThan(Number(fWithBefore))
    expect(await page.getByTestId('schedule-summary').innerText()).toBe('36 animals in 3 releases in years 0–10.')

    await page.getByLabel('Selection s', { exact: true }).fill('0.2')
    await until(() => page.getByTestId('results').locator('[data-caution="strong-selection"]').count(), count => count > 0)

    await saved(page)
    const stored = await detail(proposalId)
    const scenario = stored.scenarios.find(item => !item.isBaseline)!
    expect(scenario.inputs.schedule).toMatchObject({ females: 6, males: 6, animalsPerEvent: 12 })
    expect(scenario.inputs.variants[0]?.s).toBe(0.2)
  })

  it('the numbers on screen equal the engine\'s for the same inputs', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    await page.goto(`${server.url}/proposals/${proposalId}`)
    await hydrated(page)
    await until(() => page.getByTestId('results').getAttribute('data-state'), state => state === 'ready')
    await until(() => page.getByTestId('exact-value').first().getAttribute('data-status'), status => status === 'computed')

    const stored = await detail(proposalId)
    const scenario = stored.scenarios.find(item => !item.isBaseline)!
    const recipient = resolveRecipient(stored.recipient, scenario.inputs.recipientOverrides).figures!
    const engine = computeScenarioResults({ recipient, inputs: scenario.inputs, outbreedingAnswers: stored.proposal.outbreedingAnswers })
    const variant = engine.establishment[0]!

    const shown = async (testId: string) => Number(await page.getByTestId(testId).first().getAttribute('data-value'))
    const close = (a: number, b: number) => Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(b), 1e-300)
    expect(close(await shown('establishment-figure'), variant.headline.probability)).toBe(true)
    expect(await figure(page).innerText()).toBe(formatProbability(variant.headline.probability))
    expect(await figure(page).getAttribute('data-method')).toBe(variant.headline.method)
    expect(close(await shown('diffusion-value'), variant.diffusion.probability)).toBe(true)
    expect(close(await shown('haldane-value'), variant.haldane.probability)).toBe(true)
    if (variant.exact.status === 'computed') expect(close(await shown('exact-value'), variant.exact.probability)).toBe(true)
    expect(close(await shown('f-with'), engine.projection.atHorizon.inbreedingWith)).toBe(true)
    expect(close(await shown('f-without'), engine.projection.atHorizon.inbreedingWithout)).toBe(true)
    expect(close(await shown('fitness-ratio'), engine.projection.atHorizon.fitnessRatio)).toBe(true)
    expect(close(await shown('migrants-value'), engine.oneMigrantRule.value)).toBe(true)
    expect(await page.getByTestId('f-with').innerText()).toBe(engine.projection.atHorizon.inbreedingWith.toFixed(3))
    expect(Number(await page.getByTestId('results').getAttribute('data-compute-ms'))).toBeGreaterThan(0)
  })

  it('every number opens its method, assumptions and sources in one click', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    await page.goto(`${server.url}/proposals/${proposalId}`)
    await hydrated(page)
    await figure(page).waitFor()
    const button = page.locator('[data-explain="establishment.haldane"]').first()
    await button.click()
    const panel = page.getByRole('region', { name: '"2hs" rule of thumb' })
    await panel.waitFor()
    expect(await panel.innerText()).toMatch(/Assumes[\s\S]*Haldane JBS \(1927\)/i)
    await page.keyboard.press('Escape')
    expect(await panel.count()).toBe(0)
  })

  it('adds a second scenario, pins both side by side and compares them on the compare page', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    await page.goto(`${server.url}/proposals/${proposalId}`)
    await hydrated(page)
    await page.getByTestId('add-scenario').click()
    await until(() => page.locator('[data-testid^="scenario-card-"]').count(), count => count === 3).catch(async (error: Error) => {
      throw new Error(`${error.message}; alerts: ${JSON.stringify(await page.getByRole('alert').allInnerTexts())}`)
    })
    await until(() => page.getByRole('heading', { name: /Inputs · Scenario B/ }).count(), count => count === 1)
    await page.getByLabel('Releases', { exact: true }).fill('6')
    await saved(page)

    for (const name of ['Scenario A', 'Scenario B']) await page.getByRole('button', { name: `Pin ${name} side by side` }).click()
    const pinned = page.getByTestId('pinned')
    await pinned.waitFor()
    const headers = await pinned.locator('thead th').allInnerTexts()
    expect(headers.join(' ')).toMatch(/Scenario A[\s\S]*Scenario B/)
    expect(await pinned.innerText()).toMatch(/× 6 every 5 years/)

    await page.getByRole('link', { name: 'Compare scenarios' }).click()
    await page.waitForURL(url => url.pathname === `/proposals/${proposalId}/compare`)
    const table = page.getByTestId('compare-table')
    await table.waitFor()
    await until(() => table.locator('td[data-key^="establishment:"]').count(), count => count === 3)
    const stored = await detail(proposalId)
    for (const scenario of stored.scenarios.filter(item => !item.isBaseline)) {
      const recipient = resolveRecipient(stored.recipient, scenario.inputs.recipientOverrides).figures!
      const engine = computeScenarioResults({ recipient, inputs: scenario.inputs, outbreedingAnswers: stored.proposal.outbreedingAnswers })
      const column = await table.locator('thead th').evaluateAll((cells, id) => cells.findIndex(cell => cell.getAttribute('data-scenario') === String(id)), scenario.id)
      const cell = table.locator('tbody tr').nth(1).locator('td').nth(column - 1)
      expect(Number(await cell.getAttribute('data-value'))).toBeCloseTo(engine.establishment[0]!.headline.probability, 12)
    }
    await page.getByTestId('tornado-establishment').waitFor()
    expect(await page.getByTestId('tornado-establishment').getAttribute('data-order')).toMatch(/lethalEquivalents$/)
    await page.getByTestId('heatmap').waitFor()

    const recommend = page.getByTestId('recommend')
    await recommend.getByLabel('Scenario B').check()
    await recommend.getByLabel('Why Scenario B?').fill('More releases keep F lower at the same establishment chance (browser test).')
    await saved(page)
    const after = await detail(proposalId)
    expect(after.proposal.recommendedScenarioId).toBe(after.scenarios.find(item => item.name === 'Scenario B')!.id)
    expect(after.proposal.narrative.recommendationReason).toMatch(/More releases keep F lower/)
    await screenshot(page, 'proposal-compare-1280')
  })

  it('a 409 shows the server\'s explanation, keeps the edits and reloads their version', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    await page.goto(`${server.url}/proposals/${proposalId}`)
    await hydrated(page)
    // Someone else saves first.
    const manager = await server.signIn(demo.manager)
    const current = await detail(proposalId)
    const theirs = await manager.patch(`/api/proposals/${proposalId}`, { version: current.proposal.version, narrative: { permitsNeeded: 'Their permits text.' } })
    expect(theirs.status).toBe(200)

    await page.getByLabel('Monitoring plan', { exact: true }).fill('My monitoring plan, typed while they saved.')
    const conflict = page.getByTestId('conflict')
    await conflict.waitFor({ timeout: 15_000 })
    expect(await conflict.innerText()).toMatch(/Someone else saved this proposal after you opened it/)
    expect(await page.getByLabel('Monitoring plan', { exact: true }).inputValue()).toBe('My monitoring plan, typed while they saved.')
    expect(await page.getByTestId('save-state').getAttribute('data-state')).toBe('conflict')

    await conflict.getByRole('button', { name: 'Reload their version' }).click()
    const kept = page.getByTestId('kept-edits')
    await kept.waitFor()
    expect(await page.getByLabel('Permits needed', { exact: true }).inputValue()).toBe('Their permits text.')
    await kept.getByRole('button', { name: 'Apply my edits again' }).click()
    expect(await page.getByLabel('Monitoring plan', { exact: true }).inputValue()).toBe('My monitoring plan, typed while they saved.')
    await saved(page)
    const merged = await detail(proposalId)
    expect(merged.proposal.narrative).toMatchObject({ permitsNeeded: 'Their permits text.', monitoringPlan: 'My monitoring plan, typed while they saved.' })
  })
})

describe('layout and roles', () => {
  beforeAll(async () => {
    if (proposalId) return
    const biologist = await server.signIn(demo.biologist)
    const list = await biologist.get<{ items: { id: number }[] }>('/api/proposals')
    proposalId = list.body.items[0]!.id
  })

  it('three columns at 1280 wide, one column at 820 (tablet) with the results bar', async () => {
    const wide = await browser.signedInPage(server.url, demo.biologist)
    await wide.goto(`${server.url}/proposals/${proposalId}`)
    await hydrated(wide)
    const inputs = await wide.getByRole('complementary', { name: 'Scenario inputs' }).boundingBox()
    const proposal = await wide.getByRole('complementary', { name: 'Proposal' }).boundingBox()
    const results = await wide.getByTestId('results').boundingBox()
    expect(Math.abs(inputs!.y - proposal!.y)).toBeLessThan(40)
    expect(inputs!.x).toBeLessThan(results!.x)
    expect(results!.x).toBeLessThan(proposal!.x)
    expect(await wide.getByTestId('results-dock').isVisible()).toBe(false)

    const tablet = await browser.newPage({ width: 820, height: 1180 })
    await tablet.goto(`${server.url}/login`)
    await tablet.getByLabel(/e-?mail/i).fill(demo.biologist)
    await tablet.getByLabel(/password/i).fill('tributary-demo')
    await tablet.getByRole('button', { name: /sign in/i }).click()
    await tablet.waitForURL(url => !url.pathname.startsWith('/login'))
    await tablet.goto(`${server.url}/proposals/${proposalId}`)
    await hydrated(tablet)
    const narrowInputs = await tablet.getByRole('complementary', { name: 'Scenario inputs' }).boundingBox()
    const narrowResults = await tablet.getByTestId('results').boundingBox()
    expect(narrowResults!.y).toBeGreaterThan(narrowInputs!.y + narrowInputs!.height - 1)
    expect(Math.abs(narrowResults!.x - narrowInputs!.x)).toBeLessThan(2)
    expect(await tablet.getByTestId('results-dock').isVisible()).toBe(true)
    await screenshot(tablet, 'proposal-workspace-820')
  })

  it('a viewer reads the workspace but cannot change it', async () => {
    const page = await browser.signedInPage(server.url, demo.viewer)
    await page.goto(`${server.url}/proposals/${proposalId}`)
    await hydrated(page)
    expect(await page.getByText('Your role can read proposals but not change them.').isVisible()).toBe(true)
    expect(await page.getByLabel('Females per release', { exact: true }).isDisabled()).toBe(true)
    expect(await page.getByTestId('add-scenario').count()).toBe(0)
    await until(() => figure(page).getAttribute('data-value'), value => value !== null)
    await page.goto(`${server.url}/proposals`)
    expect(await page.getByTestId('new-proposal').count()).toBe(0)
  })
})
