/**
 * The subpopulation record page in a real browser (Debian's Chromium) against the built server:
 * the header and in-page index, adding a census year (table and chart follow), a CSV import with
 * one bad row (the error names the row and nothing is stored), a live sex-ratio Ne saved with its
 * provenance, choosing the working Ne with a reason, the projections, and a viewer's read-only view.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { useBrowser } from '../support/browser'
import { demo, eventually, useServer } from '../support/server'

const server = useServer()
const browser = useBrowser()

let subpopulationId: number
const NAME = 'Brackenveil Knob'

beforeAll(async () => {
  const found = await server.db.query<{ id: number }>('SELECT id FROM subpopulations WHERE name = $1', [NAME])
  subpopulationId = found.rows[0]!.id // the demo seed has this subpopulation
})

async function openRecord(email: string, width = 1280): Promise<Page> {
  const page = await browser.signedInPage(server.url, email)
  await page.setViewportSize({ width, height: 900 })
  await page.goto(`${server.url}/subpopulations/${subpopulationId}`)
  await page.getByRole('heading', { level: 1, name: NAME }).waitFor()
  // Wait until the app has hydrated (buttons are disabled before).
  await page.getByRole('button', { name: 'Add a year' }).and(page.locator(':not([disabled])')).waitFor()
  return page
}

function censusCard(page: Page) {
  return page.getByRole('region', { name: 'Census', exact: true })
}

async function storedCensus(year: number): Promise<{ adults: number, males: number | null, females: number | null } | undefined> {
  const result = await server.db.query('SELECT adults, males, females FROM census_counts WHERE subpopulation_id = $1 AND year = $2', [subpopulationId, year])
  return result.rows[0]
}

describe('subpopulation record page', () => {
  it('shows the header figures and an in-page index of the stacked sections', async () => {
    const page = await openRecord(demo.biologist)
    const index = page.getByRole('navigation', { name: 'Sections of this record' })
    expect((await index.getByRole('link').allInnerTexts()).map(text => text.trim()))
      .toEqual(['Overview', 'Census', 'Effective size', 'Genetic profile', 'Projections', 'Files'])
    expect(await page.getByTestId('header-working-ne').innerText()).toBe('31')
    expect(await page.getByTestId('header-status').innerText()).toMatch(/Losing diversity fast/)
    await index.getByRole('link', { name: 'Projections' }).click()
    await page.waitForURL(/#projections$/)
    expect(await page.getByRole('link', { name: 'Projections' }).getAttribute('aria-current')).toBe('location')
  })

  it('adds a census year: the table and the chart follow', async () => {
    const page = await openRecord(demo.biologist)
    const card = censusCard(page)
    await card.getByRole('button', { name: 'Add a year' }).click()
    const dialog = page.getByRole('dialog', { name: 'Add a census year' })
    expect(await dialog.getByLabel('Year').inputValue()).toBe('2025') // the year after the last census
    await dialog.getByLabel('Adults').fill('140')
    await dialog.getByLabel(/^Males/).fill('80')
    await dialog.getByLabel('Females').fill('70')
    await dialog.getByRole('button', { name: 'Add year' }).click()
    // Checked in the browser before sending: 80 + 70 > 140.
    await dialog.getByText('Males and females together (150) cannot be more than adults (140).').waitFor()
    await dialog.getByLabel('Females').fill('55')
    await dialog.getByRole('button', { name: 'Add year' }).click()
    await card.getByText('The 2025 census was added.').waitFor()

    const row = card.locator('tr[data-year="2025"]')
    expect((await row.innerText()).replace(/\s+/g, ' ')).toMatch(/^2025 140 80 55 5/)
    expect(await storedCensus(2025)).toEqual({ adults: 140, males: 80, females: 55 })
    // The chart's words and drawing include the new year.
    await eventually(async () => (await card.locator('figure p.sr-only').innerText()).includes('2025: 140 adults (80 males, 55 females, 5 not sexed)'))
    await eventually(async () => (await card.locator('figure svg').first().innerHTML()).includes('2025'))
    // The header's latest census follows too.
    await page.getByText('adults in 2025').waitFor()
  })

  it('imports a CSV with one bad row: the error names the row and nothing is stored', async () => {
    const page = await openRecord(demo.biologist)
    const card = censusCard(page)
    await card.getByRole('button', { name: 'Import CSV' }).click()
    const dialog = page.getByRole('dialog', { name: `Import census years into ${NAME}` })
    expect(await dialog.getByRole('link', { name: 'Download the template' }).getAttribute('download')).toBe('census-template.csv')
    const csv = 'year,adults,males,females,method,source\n1990,60,20,25,count,Old report\n1991,-4,,,count,Old report\n'
    await dialog.getByLabel('CSV file').setInputFiles({ name: 'old-counts.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
    await dialog.getByRole('button', { name: 'Import' }).click()
    const problems = dialog.getByTestId('import-problems')
    await problems.waitFor()
    expect(await problems.innerText()).toBe('Row 3, adults: Adults cannot be negative.')
    expect(await dialog.getByRole('alert').innerText()).toMatch(/Nothing was imported/)
    expect(await storedCensus(1990)).toBeUndefined()

    // Fixed file: both rows arrive.
    await dialog.getByLabel('CSV file').setInputFiles({ name: 'old-counts.csv', mimeType: 'text/csv', buffer: Buffer.from(csv.replace('1991,-4', '1991,58')) })
    await dialog.getByRole('button', { name: 'Import' }).click()
    await card.getByText('Census imported from old-counts.csv: 2 years added.').waitFor()
    expect(await storedCensus(1991)).toEqual({ adults: 58, males: null, females: null })
    await card.locator('tr[data-year="1991"]').waitFor()
  })

  it('computes a sex-ratio Ne as you type and saves it with its provenance; then it becomes the working Ne', async () => {
    const page = await openRecord(demo.biologist)
    const estimator = page.locator('section[data-method="sex-ratio"]')
    await estimator.getByLabel('Breeding males').fill('20')
    await estimator.getByLabel('Breeding females').fill('30')
    // 4 · 20 · 30 / 50 = 48 (Wright 1931; SCIENCE.md §5), computed in the browser.
    await eventually(async () => (await estimator.getByTestId('estimate-result').innerText()).trim() === '48')
    await estimator.getByLabel('Source').fill('Spring 2025 transect, sexed adults')
    await estimator.getByRole('button', { name: 'Save estimate' }).click()
    await page.getByText('Saved: sex ratio estimate, Ne 48.').waitFor()

    const stored = await server.db.query(`SELECT id, value, inputs, source, created_by FROM effective_size_estimates WHERE subpopulation_id = $1 AND source = 'Spring 2025 transect, sexed adults'`, [subpopulationId])
    expect(stored.rows).toHaveLength(1)
    expect(stored.rows[0]).toMatchObject({ value: 48, inputs: { males: 20, females: 30 } })
    const row = page.locator(`tr[data-estimate="${stored.rows[0].id}"]`)
    expect((await row.innerText()).replace(/\s+/g, ' ')).toMatch(/Sex ratio 48 20 males, 30 females Spring 2025 transect, sexed adults saved by /)

    await row.getByRole('button', { name: /Actions for the sex ratio estimate/ }).click()
    await page.getByRole('menuitem', { name: 'Use as working Ne' }).click()
    const dialog = page.getByRole('dialog', { name: 'Choose the working Ne' })
    expect(await dialog.getByLabel('Working Ne').inputValue()).toBe('48')
    await dialog.getByRole('button', { name: 'Save working Ne' }).click()
    await dialog.getByText(/Write why this is the working Ne/).first().waitFor()
    await dialog.getByLabel('Why this figure').fill('Sexed spring count; family sizes not known yet.')
    await dialog.getByRole('button', { name: 'Save working Ne' }).click()
    await page.getByText('The working Ne is now 48.').waitFor()
    await eventually(async () => (await page.getByTestId('header-working-ne').innerText()) === '48')
    expect(await page.getByTestId('projection-ne').innerText()).toBe('48')
    expect(await row.getByText('Working Ne').count()).toBe(1)
  })

  it('projects F, H and fitness over 50 years with the conversion to generations stated and the caution shown', async () => {
    const page = await openRecord(demo.biologist)
    const conversion = await page.getByTestId('projection-conversion').innerText()
    // Generation time of this subpopulation: 4 years → 50 / 4 = 12.5 generations, 12 whole (48 years).
    expect(conversion).toMatch(/50 years is 12\.5 generations at 4 years per generation/)
    expect(conversion).toMatch(/runs 12 generations \(48 years\)/)
    expect(await page.getByText('Agency policy, permits and licensed practice govern any translocation.').count()).toBeGreaterThan(0)
    const method = { name: 'Method for inbreeding F', exact: true }
    await page.getByRole('button', method).click()
    await page.getByRole('region', method).getByText(/Wright S \(1931\)/).waitFor()
    await page.keyboard.press('Escape')
    expect(await page.getByRole('region', method).count()).toBe(0)
  })

  it('is read-only for a viewer', async () => {
    const page = await browser.signedInPage(server.url, demo.viewer)
    await page.goto(`${server.url}/subpopulations/${subpopulationId}`)
    await page.getByRole('heading', { level: 1, name: NAME }).waitFor()
    await page.locator('section[data-method="sex-ratio"]').waitFor()
    for (const name of ['Add a year', 'Import CSV', 'Edit attributes', 'Save estimate', 'Change the working Ne']) {
      expect(await page.getByRole('button', { name }).count(), name).toBe(0)
    }
  })

  it('answers an unknown record with a way back to the Atlas', async () => {
    const page = await browser.signedInPage(server.url, demo.biologist)
    await page.goto(`${server.url}/subpopulations/999999`)
    await page.getByText('No such subpopulation').waitFor()
    expect(await page.getByRole('link', { name: 'Back to the Atlas' }).getAttribute('href')).toBe('/')
  })
})
