/**
 * Remembered answers (server/utils/read-cache.ts) never outlive the records: the subpopulation
 * list and a proposal's detail, read again after a change — made through the API, or behind the
 * server's back with plain SQL as another process or machine would — show the change at once,
 * however many requests read them at the same moment. A remembered answer is never handed to
 * another agency, and a user refused after it was remembered stays refused.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { createProposal, demoRecords } from './proposals-support'

const server = useServer()

let biologist: ApiClient
let viewer: ApiClient
let otherBiologist: ApiClient
let records: Awaited<ReturnType<typeof demoRecords>>
let speciesId: number

beforeAll(async () => {
  const other = await createOtherAgency(server)
  records = await demoRecords(server)
  biologist = await server.signIn(demo.biologist)
  viewer = await server.signIn(demo.viewer)
  otherBiologist = await server.signIn(other.biologistEmail, otherAgencyPassword)
  const species = await server.db.query<{ species_id: number }>('SELECT species_id FROM subpopulations WHERE id = $1', [records.owlfeather])
  speciesId = species.rows[0]!.species_id
})

interface ListItem { id: number, name: string, latestCensus: { year: number, adults: number } | null, latestEstimate: { value: number } | null }

async function listItem(client: ApiClient, id: number): Promise<ListItem | undefined> {
  const response = await client.get(`/api/subpopulations?speciesId=${speciesId}`)
  expect(response.status).toBe(200)
  return (response.body.items as ListItem[]).find(item => item.id === id)
}

describe('the subpopulation list', () => {
  it('shows a census added through the API and an estimate added with plain SQL on the next read', async () => {
    const before = await listItem(viewer, records.owlfeather)
    expect(await listItem(viewer, records.owlfeather)).toEqual(before) // remembered

    const year = 2031
    expect((await biologist.post(`/api/subpopulations/${records.owlfeather}/census`, { year, adults: 77 })).status).toBe(201)
    expect((await listItem(viewer, records.owlfeather))?.latestCensus).toEqual({ year, adults: 77 })

    await server.db.query(
      `INSERT INTO effective_size_estimates (subpopulation_id, method, inputs, value, estimated_on, source)
       VALUES ($1, 'sex-ratio', '{"males": 10, "females": 10}', 20, '2031-06-01', 'Written behind the server''s back')`,
      [records.owlfeather],
    )
    expect((await listItem(viewer, records.owlfeather))?.latestEstimate?.value).toBe(20)

    await server.db.query(`UPDATE subpopulations SET name = name || ' (renamed)' WHERE id = $1`, [records.owlfeather])
    expect((await listItem(viewer, records.owlfeather))?.name).toMatch(/\(renamed\)$/)
    await server.db.query(`UPDATE subpopulations SET name = replace(name, ' (renamed)', '') WHERE id = $1`, [records.owlfeather])
    expect((await listItem(viewer, records.owlfeather))?.name).not.toMatch(/renamed/)
  })

  it('gives 40 simultaneous readers the same answer, and the new one to 40 readers right after a write', async () => {
    const read = () => Promise.all(Array.from({ length: 40 }, () => listItem(viewer, records.quillmoss)))
    const first = await read()
    expect(new Set(first.map(item => JSON.stringify(item))).size).toBe(1)
    await server.db.query(`UPDATE census_counts SET adults = adults + 1 WHERE subpopulation_id = $1 AND year = (SELECT max(year) FROM census_counts WHERE subpopulation_id = $1)`, [records.quillmoss])
    const second = await read()
    expect(second.map(item => item?.latestCensus?.adults)).toEqual(first.map(item => (item?.latestCensus?.adults ?? 0) + 1))
  })

  it('is never handed to another agency: its species is 404 there, remembered or not', async () => {
    expect((await viewer.get(`/api/subpopulations?speciesId=${speciesId}`)).status).toBe(200)
    expectErrorAnswer(await otherBiologist.get(`/api/subpopulations?speciesId=${speciesId}`), 404, /Species not found/)
    const theirs = await otherBiologist.get('/api/subpopulations')
    expect(theirs.status).toBe(200)
    expect((theirs.body.items as ListItem[]).map(item => item.id)).not.toContain(records.owlfeather)
  })
})

describe('a proposal\'s detail', () => {
  it('shows edits through the API, and renamed people, records and scenarios changed with plain SQL', async () => {
    const created = await createProposal(biologist, { title: 'Remembered detail', recipientId: records.owlfeather, purpose: 'Cache check.', sourceSubpopulationIds: [records.quillmoss] })
    const url = `/api/proposals/${created.proposal.id}`
    const first = await viewer.get(url)
    expect(first.status).toBe(200)
    expect((await viewer.get(url)).body).toEqual(first.body)

    expect((await biologist.patch(url, { title: 'Remembered detail, edited', version: 0 })).status).toBe(200)
    expect((await viewer.get(url)).body.proposal.title).toBe('Remembered detail, edited')

    await server.db.query(`UPDATE users SET name = 'Renamed Biologist' WHERE id = $1`, [first.body.author.id])
    expect((await viewer.get(url)).body.author.name).toBe('Renamed Biologist')

    await server.db.query(`UPDATE scenarios SET name = 'Renamed baseline' WHERE proposal_id = $1 AND is_baseline`, [created.proposal.id])
    expect((await viewer.get(url)).body.scenarios[0].name).toBe('Renamed baseline')

    await server.db.query(`INSERT INTO census_counts (subpopulation_id, year, adults) VALUES ($1, 2040, 9)`, [records.quillmoss])
    expect((await viewer.get(url)).body.sources[0].latestCensus).toEqual({ year: 2040, adults: 9 })

    expectErrorAnswer(await otherBiologist.get(url), 404, /Proposal not found/)
    await server.db.query('DELETE FROM proposals WHERE id = $1', [created.proposal.id])
    expectErrorAnswer(await viewer.get(url), 404, /Proposal not found/)
  })

  it('is refused to a user deactivated after it was remembered', async () => {
    const list = await biologist.get('/api/proposals')
    const url = `/api/proposals/${list.body.items[0].id}`
    const reader = await server.signIn(demo.viewer)
    expect((await reader.get(url)).status).toBe(200)
    await server.db.query(`UPDATE users SET active = false WHERE email = $1`, [demo.viewer])
    try {
      expectErrorAnswer(await reader.get(url), 401, /session has ended/)
    } finally {
      await server.db.query(`UPDATE users SET active = true WHERE email = $1`, [demo.viewer])
    }
  })
})
