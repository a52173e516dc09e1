/**
 * The Atlas in a real browser (Debian's Chromium) against the built server: a biologist sees
 * the demo subpopulations in the list and on the map, selects one and reads its card, draws a
 * new boundary with the drawing tools (clicks on the map) and saves it with the attributes
 * form, and imports a CSV with one bad row and reads which row and why. A viewer gets no
 * editing tools.
 */
import { describe, expect, it } from 'vitest'
import type { Locator, Page } from 'playwright-core'
import { useBrowser } from '../support/browser'
import { demo, eventually, useServer } from '../support/server'

const server = useServer()
const browser = useBrowser()

const DEMO_NAMES = [
  'Ashfern Hollow', 'Brackenveil Knob', 'Cinderbrook Cove', 'Fernwhistle Creek', 'Lanternmoss Gap',
  'Mossgate Plateau', 'Owlfeather Bald', 'Quillmoss Ridge', 'Silverthread Branch', 'Stonelantern Flats',
]

/** Signs in and waits until the Atlas has drawn `count` subpopulations on the map. */
async function openAtlas(email: string, count = 10): Promise<Page> {
  const page = await browser.signedInPage(server.url, email)
  await page.getByRole('heading', { level: 1, name: 'Atlas', exact: true }).waitFor()
  await page.locator(`.atlas-map[data-ready="true"][data-drawn="${count}"]`).waitFor({ timeout: 20_000 })
  return page
}

function list(page: Page): Locator {
  return page.getByRole('list', { name: 'Subpopulations' })
}

async function listedNames(page: Page): Promise<string[]> {
  const rows = list(page).locator('button[data-subpopulation-id] span.truncate.text-\\[14\\.5px\\]')
  return (await rows.allInnerTexts()).map(text => text.trim())
}

async function subpopulationCount(): Promise<number> {
  return Number((await server.db.query<{ count: string }>('SELECT count(*) FROM subpopulations')).rows[0]?.count)
}

describe('Atlas', () => {
  it('shows the demo subpopulations in the list and on the map; selecting one opens its card', async () => {
    const page = await openAtlas(demo.biologist)
    expect((await listedNames(page)).sort()).toEqual(DEMO_NAMES)
    // The legend explains the encoding in words.
    const legend = page.getByRole('region', { name: 'Legend' })
    for (const words of ['Losing diversity fast', 'Declining', 'Watch', 'Stable', 'Well connected']) await legend.getByText(words, { exact: true }).waitFor()

    await list(page).getByRole('button', { name: /Quillmoss Ridge/ }).click()
    const card = page.getByRole('region', { name: 'Quillmoss Ridge' })
    await card.waitFor()
    const text = await card.innerText()
    expect(text).toMatch(/Watch/)
    expect(text).toMatch(/PROJECTED F IN 10 GENERATIONS\s+0\.014/i)
    expect(text).toMatch(/1,627 adults/)
    expect(text).toMatch(/agency policy, permits and licensed practice govern any translocation/)
    expect(await card.getByRole('link', { name: 'Open record' }).getAttribute('href')).toMatch(/^\/subpopulations\/\d+$/)
    expect(await card.getByRole('link', { name: /Start proposal here/ }).getAttribute('href')).toMatch(/^\/proposals\/new\?recipientId=\d+$/)
    const id = (await server.db.query<{ id: number }>(`SELECT id FROM subpopulations WHERE name = 'Quillmoss Ridge'`)).rows[0]?.id
    await page.locator(`.atlas-map[data-selected="${id}"]`).waitFor()
    expect(new URL(page.url()).searchParams.get('subpopulation')).toBe(String(id))

    // Search and the status filter narrow list and map together.
    await page.getByLabel('Search subpopulations').fill('fern')
    await eventually(async () => (await listedNames(page)).join() === 'Fernwhistle Creek,Ashfern Hollow' || (await listedNames(page)).sort().join() === 'Ashfern Hollow,Fernwhistle Creek')
    await page.locator('.atlas-map[data-drawn="2"]').waitFor()
    await page.getByLabel('Search subpopulations').fill('')
    await page.getByRole('group', { name: 'Show statuses' }).getByRole('button', { name: /Losing diversity fast/ }).click()
    await page.locator('.atlas-map[data-drawn="5"]').waitFor()
  })

  it('draws a new subpopulation on the map and saves it with its attributes', async () => {
    const page = await openAtlas(demo.biologist)
    const before = await subpopulationCount()
    await page.getByRole('button', { name: 'New subpopulation' }).click()
    await page.getByRole('menuitem', { name: 'Draw an area on the map' }).click()
    await page.locator('.atlas-map[data-drawing="polygon"]').waitFor()
    await page.getByRole('region', { name: 'Boundary editing' }).getByText(/click the first corner to close the shape/).waitFor()

    const box = await page.locator('.atlas-map').boundingBox()
    if (!box) throw new Error('no map on the page')
    // A square of about 90 px in the middle of the map, then back to the first corner to close it.
    const corners = [[0.52, 0.36], [0.62, 0.36], [0.62, 0.5], [0.52, 0.5]] as const
    const handles = page.locator('.atlas-map .marker-icon')
    for (const [index, [x, y]] of corners.entries()) {
      await page.mouse.click(box.x + box.width * x, box.y + box.height * y)
      await eventually(async () => (await handles.count()) >= index + 1) // geoman has placed the corner
    }
    await page.mouse.click(box.x + box.width * corners[0][0], box.y + box.height * corners[0][1])

    const dialog = page.getByRole('dialog', { name: 'New subpopulation' })
    await dialog.waitFor()
    expect(await dialog.innerText()).toMatch(/An area of [\d.,]+ km²/)
    await dialog.getByLabel('Name').fill('Drawn Hollow')
    await dialog.getByLabel('Environment class').fill('cove forest')
    await dialog.getByLabel('Generation time (years)').fill('3')
    await dialog.getByRole('button', { name: 'Create subpopulation' }).click()
    await page.getByRole('status').filter({ hasText: 'Drawn Hollow was created' }).waitFor()
    await page.getByRole('region', { name: 'Drawn Hollow' }).waitFor()
    await page.locator('.atlas-map[data-drawn="11"]').waitFor()

    expect(await subpopulationCount()).toBe(before + 1)
    const row = (await server.db.query(`SELECT geometry, area_km2, environment_class, generation_time_years FROM subpopulations WHERE name = 'Drawn Hollow'`)).rows[0]
    expect(row.geometry.type).toBe('Polygon')
    expect(row.geometry.coordinates[0]).toHaveLength(5)
    expect(row.area_km2).toBeGreaterThan(0.001)
    expect(row).toMatchObject({ environment_class: 'cove forest', generation_time_years: 3 })
  })

  it('imports a CSV with one bad row: nothing is stored and the dialog names the row and the reason', async () => {
    const page = await openAtlas(demo.biologist, await subpopulationCount())
    const before = await subpopulationCount()
    await page.getByRole('button', { name: 'Import' }).click()
    const dialog = page.getByRole('dialog', { name: 'Import subpopulations' })
    await dialog.waitFor()
    const csv = [
      'name,latitude,longitude,generation_time_years',
      'Upper Seep,35.61,-83.45,3',
      'Misplaced Seep,135.2,-83.05,3',
      'Lower Seep,35.2,-83.1,2.5',
    ].join('\n')
    await dialog.getByLabel('File', { exact: true }).setInputFiles({ name: 'seeps.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
    await dialog.getByRole('button', { name: 'Import' }).click()
    await dialog.getByRole('alert').filter({ hasText: 'Nothing was imported' }).waitFor()
    const table = dialog.getByRole('table', { name: 'Problems found in the file' })
    await table.waitFor()
    const cells = (await table.locator('tbody tr').first().locator('td').allInnerTexts()).map(cell => cell.replace(/\s+/g, ' ').trim())
    expect(cells).toEqual(['Row 3 Misplaced Seep', 'latitude must be between -90 and 90 degrees, got 135.2.'])
    expect(await subpopulationCount()).toBe(before)

    // Fixed, the same file imports whole.
    await dialog.getByLabel('File', { exact: true }).setInputFiles({ name: 'seeps.csv', mimeType: 'text/csv', buffer: Buffer.from(csv.replace('135.2', '35.25')) })
    await dialog.getByRole('button', { name: 'Import' }).click()
    await page.getByRole('status').filter({ hasText: 'Import done: 3 new' }).waitFor()
    expect(await subpopulationCount()).toBe(before + 3)
  })

  it('a viewer reads the Atlas without editing tools', async () => {
    const page = await openAtlas(demo.viewer, await subpopulationCount())
    expect(await page.getByRole('button', { name: 'New subpopulation' }).count()).toBe(0)
    expect(await page.getByRole('button', { name: 'Import' }).count()).toBe(0)
    await page.getByRole('button', { name: 'Export' }).waitFor()
    await list(page).getByRole('button', { name: /Owlfeather Bald/ }).click()
    const card = page.getByRole('region', { name: 'Owlfeather Bald' })
    await card.waitFor()
    expect(await card.getByRole('button', { name: 'Edit boundary' }).count()).toBe(0)
    expect(await card.getByRole('link', { name: /Start proposal here/ }).count()).toBe(0)
    await card.getByRole('link', { name: 'Open record' }).waitFor()
  })
})

describe('editing a boundary', () => {
  /** Drags the first corner handle of the boundary being edited by (dx, dy) pixels. */
  async function dragFirstCorner(page: Page, dx: number, dy: number): Promise<void> {
    const corner = page.locator('.atlas-map .marker-icon:not(.marker-icon-middle)').first()
    await corner.waitFor()
    await page.locator('.atlas-map[data-moving="false"]').waitFor() // the map flies to the boundary first
    const box = await corner.boundingBox()
    if (!box) throw new Error('no corner handle')
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2)
    await page.mouse.down()
    await page.mouse.move(box.x + box.width / 2 + dx / 2, box.y + box.height / 2 + dy / 2, { steps: 4 })
    await page.mouse.move(box.x + box.width / 2 + dx, box.y + box.height / 2 + dy, { steps: 4 })
    await page.mouse.up()
  }

  it('saves a moved corner with the version it was loaded at; a stale version is explained', async () => {
    const page = await openAtlas(demo.manager, await subpopulationCount())
    const before = (await server.db.query(`SELECT id, geometry, version FROM subpopulations WHERE name = 'Mossgate Plateau'`)).rows[0]
    await list(page).getByRole('button', { name: /Mossgate Plateau/ }).click()
    const card = page.getByRole('region', { name: 'Mossgate Plateau' })
    await card.getByRole('button', { name: 'Edit boundary' }).click()
    const bar = page.getByRole('region', { name: 'Boundary editing' })
    await bar.getByText('Editing the boundary of Mossgate Plateau').waitFor()
    expect(await bar.getByRole('button', { name: 'Save boundary' }).isDisabled()).toBe(true)
    await dragFirstCorner(page, 30, 20)
    await bar.getByRole('button', { name: 'Save boundary' }).click()
    await page.getByRole('status').filter({ hasText: 'The boundary of Mossgate Plateau was saved.' }).waitFor()
    const after = (await server.db.query('SELECT geometry, version FROM subpopulations WHERE id = $1', [before.id])).rows[0]
    expect(after.version).toBe(before.version + 1)
    expect(after.geometry).not.toEqual(before.geometry)
    expect(after.geometry.coordinates[0].length).toBe(before.geometry.coordinates[0].length)

    // Someone else saves in between: the save is refused and says why.
    await card.getByRole('button', { name: 'Edit boundary' }).click()
    await bar.getByText('Editing the boundary of Mossgate Plateau').waitFor()
    await server.db.query(`UPDATE subpopulations SET notes = 'changed elsewhere', version = version + 1 WHERE id = $1`, [before.id])
    await dragFirstCorner(page, -20, 10)
    await bar.getByRole('button', { name: 'Save boundary' }).click()
    await bar.getByRole('alert').filter({ hasText: /Someone else saved "Mossgate Plateau" since you loaded it/ }).waitFor()
    await bar.getByRole('button', { name: 'Reload the Atlas' }).click()
    await bar.waitFor({ state: 'detached' })
    const final = (await server.db.query('SELECT geometry, version FROM subpopulations WHERE id = $1', [before.id])).rows[0]
    expect(final.version).toBe(before.version + 2)
    expect(final.geometry).toEqual(after.geometry)
  })
})
