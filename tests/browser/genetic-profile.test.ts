/**
 * The Genetic profile and Files sections of a subpopulation record in a real browser (Debian's
 * Chromium) against the built server: upload a genotype file and see its summary (values of
 * SCIENCE.md §8.3), a malformed file refused with its line, a method note one click away, the
 * F_ST heat-table and its method switch (values equal to the engine's), a viewer's read-only
 * view, and attaching a file. Screenshots go to test-results/screenshots/.
 */
import { mkdirSync } from 'node:fs'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { fstMatrix, parseGenotypeCsv } from '../../shared/genetics/index'
import { useBrowser } from '../support/browser'
import { demo, useServer } from '../support/server'
import { ALDER_HOLLOW_CSV, demoGenotypeFile, demoManifest, demoRecords } from '../api/genotypes-support'

const server = useServer()
const browser = useBrowser()
const shots = new URL('../../test-results/screenshots/', import.meta.url).pathname

let records: Awaited<ReturnType<typeof demoRecords>>

beforeAll(async () => {
  records = await demoRecords(server)
  mkdirSync(shots, { recursive: true })
})

async function openProfile(email: string, name: string): Promise<Page> {
  const page = await browser.signedInPage(server.url, email)
  await page.setViewportSize({ width: 1366, height: 1000 })
  await page.goto(`${server.url}/subpopulations/${records.subpopulations[name]}#genetic-profile`)
  await page.getByRole('heading', { level: 1, name }).waitFor()
  await page.getByRole('region', { name: 'Genotype datasets' }).waitFor()
  return page
}

function datasets(page: Page) {
  return page.getByRole('region', { name: 'Genotype datasets' })
}

async function waitForHydration(page: Page, button: string): Promise<void> {
  await page.getByRole('button', { name: button }).and(page.locator(':not([disabled])')).waitFor()
}

describe('genetic profile', () => {
  it('a biologist uploads a genotype file and sees its summary', async () => {
    const page = await openProfile(demo.biologist, 'Lanternmoss Gap')
    await datasets(page).getByText('No genotype data yet').waitFor()
    await waitForHydration(page, 'Upload and summarise')
    const form = page.getByRole('form', { name: 'Upload genotypes' })
    await form.getByLabel('Genotype file').setInputFiles({ name: 'alder-hollow.csv', mimeType: 'text/csv', buffer: Buffer.from(ALDER_HOLLOW_CSV) })
    await form.getByLabel('Marker type').selectOption('microsatellite')
    await form.getByLabel(/Year sampled/).fill('2024')
    await form.getByRole('button', { name: 'Upload and summarise' }).click()

    const row = datasets(page).locator('tr', { hasText: 'alder-hollow.csv' })
    await row.waitFor()
    const cells = await row.locator('td').allInnerTexts()
    // SCIENCE.md §8.3, Alder Hollow means: n 6, Ho 0.5, He (Nei 1978) 0.595960, F_IS 0.161017.
    expect(cells[1]).toMatch(/^6\b/)
    expect(cells.slice(2, 5)).toEqual(['0.500', '0.596', '0.161'])
    await form.getByText('alder-hollow.csv was read and summarised').waitFor()

    await row.getByRole('button', { name: /Show loci of alder-hollow.csv/ }).click()
    const loci = datasets(page).getByRole('table', { name: /Per-locus summary of alder-hollow.csv/ })
    await loci.waitFor()
    expect(await loci.locator('tbody th').allInnerTexts()).toEqual(['Loc1', 'Loc2', 'Loc3'])
    expect(await loci.locator('tbody tr').nth(1).locator('td').nth(4).innerText()).toBe('0.313') // AH Loc2 F_IS = 0.3125 (§8.3)
    await page.getByRole('region', { name: 'Genotype datasets' }).screenshot({ path: `${shots}genetic-profile-uploaded.png` })
    const stored = await server.db.query('SELECT file_name FROM genetic_datasets WHERE subpopulation_id = $1', [records.subpopulations['Lanternmoss Gap']])
    expect(stored.rows.map(r => r.file_name)).toEqual(['alder-hollow.csv'])
  })

  it('a malformed file is refused with its line, and nothing is stored', async () => {
    const page = await openProfile(demo.biologist, 'Stonelantern Flats')
    await waitForHydration(page, 'Upload and summarise')
    const form = page.getByRole('form', { name: 'Upload genotypes' })
    const bad = ALDER_HOLLOW_CSV.replace('AH3,103,105,200,200,154,158', 'AH3,103,105,200,0,154,158')
    await form.getByLabel('Genotype file').setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) })
    await form.getByLabel('Marker type').selectOption('microsatellite')
    await form.getByRole('button', { name: 'Upload and summarise' }).click()
    const alert = form.getByRole('alert')
    await alert.waitFor()
    expect(await alert.innerText()).toMatch(/Line 4: locus "Loc2": one allele is missing/)
    await form.screenshot({ path: `${shots}genetic-profile-bad-file.png` })
    const stored = await server.db.query('SELECT 1 FROM genetic_datasets WHERE subpopulation_id = $1', [records.subpopulations['Stonelantern Flats']])
    expect(stored.rowCount).toBe(0)
  })

  it('each figure\'s method and citation is one click away', async () => {
    const page = await openProfile(demo.viewer, 'Quillmoss Ridge')
    await datasets(page).locator('tr', { hasText: 'invented-quillmoss-ridge-2023.csv' }).waitFor()
    await page.getByRole('button', { name: 'How Expected heterozygosity (He, unbiased) is computed' }).click()
    const note = page.getByRole('note').filter({ hasText: 'Expected heterozygosity (He, unbiased)' })
    await note.waitFor()
    expect(await note.innerText()).toMatch(/Nei, M\. \(1978\)/)
    await page.keyboard.press('Escape')
    await note.waitFor({ state: 'detached' })
  })

  it('the F_ST heat-table switches estimator; values equal the engine\'s', async () => {
    const page = await openProfile(demo.viewer, 'Quillmoss Ridge')
    const card = page.getByRole('region', { name: 'Differentiation between subpopulations' })
    const table = card.getByRole('table')
    await table.waitFor()
    // The demo files, plus the worked example uploaded to Lanternmoss Gap by the first test.
    const known = new Map(demoManifest().map(entry => [entry.subpopulation, demoGenotypeFile(entry.file).dataset]))
    const example = parseGenotypeCsv(ALDER_HOLLOW_CSV)
    if ('dataset' in example) known.set('Lanternmoss Gap', example.dataset)
    const rowNames = (await table.locator('tbody th').allInnerTexts()).map(text => text.replace(/^\d+\s*/, '').replace('(this one)', '').trim())
    expect(rowNames).toEqual([...rowNames].sort((a, b) => a.localeCompare(b)))
    const named = rowNames.map(name => ({ name, dataset: known.get(name)! })) // every row is a known dataset
    expect(named.every(entry => entry.dataset)).toBe(true)
    const cell = () => table.locator('tbody tr').nth(0).locator('td').nth(1).innerText()
    expect(await cell()).toBe(fstMatrix(named, { method: 'hudson' }).values[0]![1]!.toFixed(3)) // six populations
    await card.getByText('Weir & Cockerham θ').click()
    const theta = fstMatrix(named, { method: 'weir-cockerham' }).values[0]![1]!.toFixed(3)
    await page.waitForFunction(
      ([expected]) => document.querySelector('[data-section="genetic-profile"] table[aria-busy] tbody tr td:nth-of-type(2)')?.textContent?.trim() === expected,
      [theta],
    )
    await card.screenshot({ path: `${shots}genetic-profile-fst.png` })
  })

  it('a viewer reads the profile but has no upload form', async () => {
    const page = await openProfile(demo.viewer, 'Quillmoss Ridge')
    await datasets(page).locator('tr', { hasText: 'invented-quillmoss-ridge-2023.csv' }).waitFor()
    expect(await page.getByRole('form', { name: 'Upload genotypes' }).count()).toBe(0)
    expect(await datasets(page).getByRole('button', { name: /^Delete/ }).count()).toBe(0)
  })
})

describe('files', () => {
  it('a biologist attaches a file and sees it listed with a download link', async () => {
    const page = await openProfile(demo.biologist, 'Owlfeather Bald')
    const files = page.getByRole('region', { name: 'Files' })
    await files.scrollIntoViewIfNeeded()
    await files.getByRole('button', { name: 'Attach', exact: true }).and(page.locator(':not([disabled])')).waitFor()
    await files.getByLabel('Attach a file', { exact: true }).setInputFiles({ name: 'survey notes.txt', mimeType: 'text/plain', buffer: Buffer.from('Night survey, invented notes.\n') })
    await files.getByRole('button', { name: 'Attach', exact: true }).click()
    const link = files.getByRole('link', { name: 'survey notes.txt' })
    await link.waitFor()
    expect(await link.getAttribute('href')).toMatch(/^\/api\/attachments\/\d+\/download\?redirect=true$/)
    await files.screenshot({ path: `${shots}files-attached.png` })
    const response = await page.request.get(`${server.url}${await link.getAttribute('href')}`)
    expect(response.status()).toBe(200)
    expect(await response.text()).toBe('Night survey, invented notes.\n')
  })
})
