/**
 * Genotype datasets: listing, detail, upload (CSV and VCF) and delete, per role; bad files
 * (malformed CSV row, multi-allelic VCF, wrong marker type, wrong type, over the limit);
 * all-or-nothing storage (no record and no stored object left when anything fails, including
 * an object-store outage); summaries equal to the engine's for the same data.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { allelicRichness, privateAlleles, smallestGeneCount, summarizeGenotypes } from '../../shared/genetics/index'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { ALDER_HOLLOW_CSV, SMALL_VCF, addSecondBiologist, demoGenotypeFile, demoManifest, demoRecords, storedKeys, streamLargeUpload, uploadForm } from './genotypes-support'

const server = useServer()

type Caller = 'anonymous' | 'viewer' | 'biologist' | 'manager' | 'administrator' | 'otherAdmin' | 'secondBiologist'
let clients: Record<Caller, ApiClient>
let records: Awaited<ReturnType<typeof demoRecords>>

beforeAll(async () => {
  records = await demoRecords(server)
  const other = await createOtherAgency(server)
  const second = await addSecondBiologist(server, records.agencyId)
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    administrator: await server.signIn(demo.admin),
    otherAdmin: await server.signIn(other.adminEmail, otherAgencyPassword),
    secondBiologist: await server.signIn(second),
  }
})

const subpopulation = (name: string) => {
  const id = records.subpopulations[name]
  if (id === undefined) throw new Error(`no subpopulation ${name}`)
  return id
}

async function datasetCount(): Promise<number> {
  const result = await server.db.query<{ count: string }>('SELECT count(*) FROM genetic_datasets')
  return Number(result.rows[0]?.count)
}

/** Keys under genotypes/ (uploads; the demo files live under seed/). */
async function uploadedKeys(): Promise<string[]> {
  return (await storedKeys(server)).filter(key => key.startsWith('genotypes/'))
}

describe('GET /api/subpopulations/:id/genotypes and GET /api/genotypes/:id', () => {
  it('401 anonymous, 200 for every role of the agency, 404 for another agency', async () => {
    const id = subpopulation('Quillmoss Ridge')
    expectErrorAnswer(await clients.anonymous.get(`/api/subpopulations/${id}/genotypes`), 401)
    for (const role of ['viewer', 'biologist', 'manager', 'administrator'] as const) {
      const list = await clients[role].get(`/api/subpopulations/${id}/genotypes`)
      expect(list.status, role).toBe(200)
      expect(list.body.items).toHaveLength(1)
      expect(list.body.canUpload).toBe(role !== 'viewer')
      const detail = await clients[role].get(`/api/genotypes/${list.body.items[0].id}`)
      expect(detail.status, role).toBe(200)
      expect(detail.body.loci).toHaveLength(12)
    }
    expectErrorAnswer(await clients.otherAdmin.get(`/api/subpopulations/${id}/genotypes`), 404, /Subpopulation not found/)
    const datasetId = (await clients.viewer.get(`/api/subpopulations/${id}/genotypes`)).body.items[0].id
    expectErrorAnswer(await clients.otherAdmin.get(`/api/genotypes/${datasetId}`), 404, /Genotype dataset not found/)
    expectErrorAnswer(await clients.viewer.get('/api/genotypes/not-a-number'), 422)
  })

  it('the seeded summaries equal the engine\'s for the committed demo files', async () => {
    const manifest = demoManifest()
    const datasets = Object.fromEntries(manifest.map(entry => [entry.subpopulation, demoGenotypeFile(entry.file).dataset]))
    const g = Math.min(...Object.values(datasets).map(dataset => smallestGeneCount(dataset).geneCount))
    const privateSummary = privateAlleles(datasets)
    for (const entry of manifest) {
      const list = await clients.viewer.get(`/api/subpopulations/${subpopulation(entry.subpopulation)}/genotypes`)
      const dto = list.body.items[0]
      const engine = summarizeGenotypes(datasets[entry.subpopulation]!).overall // built from the same manifest
      expect(dto.fileName).toBe(entry.file)
      expect(dto.current).toBe(true)
      expect(dto.diversity.observedHeterozygosity).toBe(engine.meanObservedHeterozygosity)
      expect(dto.diversity.expectedHeterozygosity).toBe(engine.meanExpectedHeterozygosity)
      expect(dto.diversity.inbreedingCoefficient).toBe(engine.inbreedingCoefficient)
      expect(dto.allelicRichness.rarefactionSize).toBe(g)
      expect(dto.allelicRichness.meanRichness).toBe(allelicRichness(datasets[entry.subpopulation]!, g).meanRichness)
      expect(dto.privateAlleles.count).toBe(privateSummary.populations[entry.subpopulation]!.count)
    }
  })
})

describe('POST /api/subpopulations/:id/genotypes', () => {
  it('401 anonymous, 403 viewer, 404 another agency — and nothing stored', async () => {
    const id = subpopulation('Lanternmoss Gap')
    const before = await datasetCount()
    const file = { name: 'ah.csv', content: ALDER_HOLLOW_CSV }
    expectErrorAnswer(await uploadForm(clients.anonymous, `/api/subpopulations/${id}/genotypes`, file, { markerType: 'microsatellite' }), 401)
    expectErrorAnswer(await uploadForm(clients.viewer, `/api/subpopulations/${id}/genotypes`, file, { markerType: 'microsatellite' }), 403, /viewer/)
    expectErrorAnswer(await uploadForm(clients.otherAdmin, `/api/subpopulations/${id}/genotypes`, file, { markerType: 'microsatellite' }), 404)
    expect(await datasetCount()).toBe(before)
    expect(await uploadedKeys()).toEqual([])
  })

  it('a biologist uploads a CSV: 201, summary equal to the engine and to SCIENCE.md §8.3, file stored, audit row', async () => {
    const id = subpopulation('Lanternmoss Gap')
    const response = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'alder-hollow.csv', content: ALDER_HOLLOW_CSV }, { markerType: 'microsatellite', sampledYear: '2024' })
    expect(response.status, JSON.stringify(response.body)).toBe(201)
    const dto = response.body
    expect(dto).toMatchObject({ fileName: 'alder-hollow.csv', format: 'csv', markerType: 'microsatellite', sampledYear: 2024, canDelete: true })
    expect(dto.createdBy.name).toBe('Robin Okafor')
    // Independent values: SCIENCE.md §8.3 (AH means: Ho 0.5, He Nei 1978 0.595960, F_IS 0.161017).
    expect(dto.diversity.observedHeterozygosity).toBeCloseTo(0.5, 12)
    expect(dto.diversity.expectedHeterozygosity).toBeCloseTo(0.595960, 6)
    expect(dto.diversity.inbreedingCoefficient).toBeCloseTo(0.161017, 6)
    const engine = summarizeGenotypes(demoParsed(ALDER_HOLLOW_CSV)).overall
    expect(dto.diversity.expectedHeterozygosity).toBe(engine.meanExpectedHeterozygosity)
    // Its loci differ from the demo microsatellites: not compared with them, rarefied to its own 12 copies.
    expect(dto.allelicRichness.rarefactionSize).toBe(12)
    expect(dto.privateAlleles).toMatchObject({ available: false, reason: expect.stringMatching(/on these loci/) })
    expect(dto.comparedWith).toEqual([])
    expect(dto.withoutSharedLoci.sort()).toEqual(demoManifest().map(entry => entry.subpopulation).sort())

    const row = await server.db.query('SELECT storage_key, size_bytes, checksum_sha256 FROM genetic_datasets WHERE id = $1', [dto.id])
    expect(row.rows[0].storage_key).toMatch(/^genotypes\/agency-\d+\/owner-\d+\/[0-9a-f-]{36}$/)
    expect(Number(row.rows[0].size_bytes)).toBe(new TextEncoder().encode(ALDER_HOLLOW_CSV).length)
    expect(await uploadedKeys()).toContain(row.rows[0].storage_key)
    const audit = await server.db.query(`SELECT action, after FROM audit_events WHERE entity_type = 'genetic_dataset' AND entity_id = $1`, [dto.id])
    expect(audit.rows.map(r => r.action)).toEqual(['genotype-dataset.upload'])
    expect(audit.rows[0].after.checksumSha256).toBe(row.rows[0].checksum_sha256)

    const link = await clients.viewer.get(`/api/genotypes/${dto.id}/download`)
    expect(link.status).toBe(200)
    expect(await (await fetch(link.body.url)).text()).toBe(ALDER_HOLLOW_CSV)
  })

  it('a VCF of biallelic SNPs is read with its samples and sites', async () => {
    const id = subpopulation('Silverthread Branch')
    const response = await uploadForm(clients.manager, `/api/subpopulations/${id}/genotypes`, { name: 'panel.vcf', content: SMALL_VCF }, { markerType: 'snp' })
    expect(response.status, JSON.stringify(response.body)).toBe(201)
    expect(response.body.format).toBe('vcf')
    expect(response.body.diversity).toMatchObject({ individualCount: 4, locusCount: 3 })
    const detail = await clients.viewer.get(`/api/genotypes/${response.body.id}`)
    expect(detail.body.loci.map((l: { locus: string }) => l.locus)).toEqual(['snp1', 'snp2', 'snp3'])
    expect(detail.body.loci[1].sampleSize).toBe(3)
  })

  it('malformed CSV row → 422 naming the line and the reason; no record, no stored object', async () => {
    const id = subpopulation('Stonelantern Flats')
    const before = await datasetCount()
    const keysBefore = await uploadedKeys()
    const bad = ALDER_HOLLOW_CSV.replace('AH3,103,105,200,200,154,158', 'AH3,103,105,200,0,154,158')
    const response = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'bad.csv', content: bad }, { markerType: 'microsatellite' })
    expectErrorAnswer(response, 422, /^Line 4: locus "Loc2": one allele is missing/)
    expect(response.body.issues[0]).toMatchObject({ path: 'file', line: 4, locus: 'Loc2' })
    const short = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'short.csv', content: 'id,L1_1,L1_2\nA1,101,103\nA2,101\n' }, { markerType: 'microsatellite' })
    expectErrorAnswer(short, 422, /^Line 3: has 2 columns; the header has 3/)
    expect(await datasetCount()).toBe(before)
    expect(await uploadedKeys()).toEqual(keysBefore)
  })

  it('multi-allelic VCF → 422 with its line; VCF declared as microsatellites → 422 on markerType', async () => {
    const id = subpopulation('Stonelantern Flats')
    const keysBefore = await uploadedKeys()
    const multi = SMALL_VCF.replace('1\t200\tsnp2\tC\tT', '1\t200\tsnp2\tC\tT,G')
    const response = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'multi.vcf', content: multi }, { markerType: 'snp' })
    expectErrorAnswer(response, 422, /^Line 5: multi-allelic site \(ALT "T,G"\)/)
    expect(response.body.issues[0].line).toBe(5)
    const wrongMarker = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'panel.vcf', content: SMALL_VCF }, { markerType: 'microsatellite' })
    expectErrorAnswer(wrongMarker, 422, /VCF file holds SNPs/)
    expect(wrongMarker.body.issues[0].path).toBe('markerType')
    const noMarker = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'ah.csv', content: ALDER_HOLLOW_CSV })
    expectErrorAnswer(noMarker, 422, /marker type/)
    const notText = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'latin1.csv', content: new Uint8Array([0x69, 0x64, 0x2C, 0xE9, 0x0A]) }, { markerType: 'snp' })
    expectErrorAnswer(notText, 422, /not UTF-8/)
    expect(await uploadedKeys()).toEqual(keysBefore)
  })

  it('another file type → 415; no file → 422; path tricks in the name are removed', async () => {
    const id = subpopulation('Stonelantern Flats')
    expectErrorAnswer(await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'table.xlsx', content: 'PK' }, { markerType: 'snp' }), 415, /Accepted: csv, tsv, txt, vcf/)
    const noFile = new FormData()
    noFile.append('markerType', 'snp')
    expectErrorAnswer(await clients.biologist.post(`/api/subpopulations/${id}/genotypes`, noFile), 422, /Choose a file/)
    expectErrorAnswer(await clients.biologist.post(`/api/subpopulations/${id}/genotypes`, { markerType: 'snp' }), 415, /multipart/)
    const tricky = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: '../../etc/..evil.csv', content: ALDER_HOLLOW_CSV }, { markerType: 'microsatellite' })
    expect(tricky.status, JSON.stringify(tricky.body)).toBe(201)
    expect(tricky.body.fileName).toBe('evil.csv')
    const row = await server.db.query('SELECT storage_key FROM genetic_datasets WHERE id = $1', [tricky.body.id])
    expect(row.rows[0].storage_key).not.toMatch(/evil|\.\./)
  })

  it('over the limit → 413: at once when Content-Length says so, and mid-stream without it; nothing stored', async () => {
    const id = subpopulation('Stonelantern Flats')
    const before = await datasetCount()
    const keysBefore = await uploadedKeys()
    const declared = await fetch(new URL(`/api/subpopulations/${id}/genotypes`, server.url), {
      method: 'POST',
      // Over this route's 10 MB but under the app-wide ceiling (security-headers.test.ts), so the route answers.
      headers: { 'content-type': 'multipart/form-data; boundary=x', 'content-length': String(12 * 1024 * 1024), 'cookie': clients.biologist.cookieHeader },
      body: new Uint8Array(12 * 1024 * 1024),
    })
    expect(declared.status).toBe(413)
    expect((await declared.json()).message).toMatch(/limit is 10 MB/)
    const streamed = await streamLargeUpload(server, clients.biologist, `/api/subpopulations/${id}/genotypes`, 'huge.csv', 40 * 1024 * 1024)
    expect(streamed.status).toBe(413)
    expect(streamed.body.message).toMatch(/too large.*10 MB/)
    expect(await datasetCount()).toBe(before)
    expect(await uploadedKeys()).toEqual(keysBefore)
    // The server is still healthy afterwards.
    expect((await clients.viewer.get(`/api/subpopulations/${id}/genotypes`)).status).toBe(200)
  })

  it('object store down → 503 with a clear message and no record', async () => {
    const id = subpopulation('Stonelantern Flats')
    const before = await datasetCount()
    await server.objectStore.stop()
    try {
      const response = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'ah.csv', content: ALDER_HOLLOW_CSV }, { markerType: 'microsatellite' })
      expectErrorAnswer(response, 503, /File storage cannot be reached.*nothing was saved/)
      expect(await datasetCount()).toBe(before)
    } finally {
      await server.objectStore.start()
    }
    const again = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'ah.csv', content: ALDER_HOLLOW_CSV }, { markerType: 'microsatellite' })
    expect(again.status).toBe(201)
    await clients.biologist.delete(`/api/genotypes/${again.body.id}`)
  })
})

describe('DELETE /api/genotypes/:id', () => {
  it('only the uploader or an administrator; the species comparisons are recomputed; audit row; file removed', async () => {
    const id = subpopulation('Fernwhistle Creek')
    const manifest = demoManifest()
    const quillmoss = manifest.find(entry => entry.subpopulation === 'Quillmoss Ridge')!
    // A copy of a demo table in another subpopulation: its alleles are shared, so Quillmoss
    // Ridge's private alleles drop to 0 while it exists.
    const upload = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'copy.csv', content: demoGenotypeFile(quillmoss.file).text }, { markerType: 'microsatellite', sampledYear: '2024' })
    expect(upload.status).toBe(201)
    const datasetId = upload.body.id as number
    const quillmossList = async () => (await clients.viewer.get(`/api/subpopulations/${subpopulation('Quillmoss Ridge')}/genotypes`)).body.items[0]
    expect((await quillmossList()).privateAlleles.count).toBe(0)
    expect((await quillmossList()).comparedWith.map((c: { subpopulationName: string }) => c.subpopulationName)).toContain('Fernwhistle Creek')

    expectErrorAnswer(await clients.anonymous.delete(`/api/genotypes/${datasetId}`), 401)
    expectErrorAnswer(await clients.viewer.delete(`/api/genotypes/${datasetId}`), 403)
    expectErrorAnswer(await clients.secondBiologist.delete(`/api/genotypes/${datasetId}`), 403, /uploaded this dataset/)
    expectErrorAnswer(await clients.manager.delete(`/api/genotypes/${datasetId}`), 403)
    expectErrorAnswer(await clients.otherAdmin.delete(`/api/genotypes/${datasetId}`), 404)
    const key = (await server.db.query('SELECT storage_key FROM genetic_datasets WHERE id = $1', [datasetId])).rows[0].storage_key

    const deleted = await clients.biologist.delete(`/api/genotypes/${datasetId}`)
    expect(deleted.status).toBe(204)
    expect((await server.db.query('SELECT 1 FROM genetic_datasets WHERE id = $1', [datasetId])).rowCount).toBe(0)
    expect(await uploadedKeys()).not.toContain(key)
    const audit = await server.db.query(`SELECT action FROM audit_events WHERE entity_type = 'genetic_dataset' AND entity_id = $1 ORDER BY id`, [datasetId])
    expect(audit.rows.map(r => r.action)).toEqual(['genotype-dataset.upload', 'genotype-dataset.delete'])
    const after = await quillmossList()
    expect(after.comparedWith.map((c: { subpopulationName: string }) => c.subpopulationName)).not.toContain('Fernwhistle Creek')
    expect(after.privateAlleles.count).toBe(privateAlleles(Object.fromEntries(manifest.map(e => [e.subpopulation, demoGenotypeFile(e.file).dataset]))).populations['Quillmoss Ridge']!.count)
    expectErrorAnswer(await clients.biologist.delete(`/api/genotypes/${datasetId}`), 404)
  })

  it('an administrator may delete a biologist\'s dataset', async () => {
    const id = subpopulation('Fernwhistle Creek')
    const upload = await uploadForm(clients.secondBiologist, `/api/subpopulations/${id}/genotypes`, { name: 'ah.csv', content: ALDER_HOLLOW_CSV }, { markerType: 'microsatellite' })
    expect(upload.status).toBe(201)
    expect((await clients.administrator.delete(`/api/genotypes/${upload.body.id}`)).status).toBe(204)
  })
})

function demoParsed(text: string) {
  const lines = text.trim().split('\n')
  const header = lines[0]!.split(',') // fixture text has a header
  const loci: string[] = []
  for (let column = 1; column < header.length; column += 2) loci.push(header[column]!.replace(/_1$/, ''))
  return {
    loci,
    individuals: lines.slice(1).map((line) => {
      const cells = line.split(',')
      return { id: cells[0]!, genotypes: loci.map((_, k) => [cells[1 + 2 * k]!, cells[2 + 2 * k]!] as [string, string]) }
    }),
  }
}
