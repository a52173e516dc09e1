/**
 * GET /api/species/:id/fst: per role, query validation, and values equal to the engine's
 * `fstMatrix` for the same datasets (the committed demo files, which this test's fresh object
 * store does not hold yet: the server puts them back from seeds/demo/genotypes/ on first use).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { fstMatrix, pairwiseFst } from '../../shared/genetics/index'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { SMALL_VCF, demoGenotypeFile, demoManifest, demoRecords, storedKeys, uploadForm } from './genotypes-support'

const server = useServer()

let clients: Record<'anonymous' | 'viewer' | 'biologist' | 'manager' | 'administrator' | 'otherAdmin', ApiClient>
let records: Awaited<ReturnType<typeof demoRecords>>

beforeAll(async () => {
  records = await demoRecords(server)
  const other = await createOtherAgency(server)
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    administrator: await server.signIn(demo.admin),
    otherAdmin: await server.signIn(other.adminEmail, otherAgencyPassword),
  }
})

/** The engine's matrix for the committed demo files, populations in name order (as the route orders them). */
function engineMatrix(method: 'hudson' | 'weir-cockerham') {
  const named = demoManifest()
    .map(entry => ({ name: entry.subpopulation, dataset: demoGenotypeFile(entry.file).dataset }))
    .sort((a, b) => a.name.localeCompare(b.name))
  return { named, matrix: fstMatrix(named, { method }) }
}

describe('GET /api/species/:id/fst', () => {
  it('restores the demo files into an empty object store on first use', async () => {
    expect((await storedKeys(server)).filter(key => key.startsWith('seed/'))).toEqual([])
    expect((await clients.viewer.get(`/api/species/${records.speciesId}/fst`)).status).toBe(200)
    const restored = (await storedKeys(server)).filter(key => key.startsWith('seed/demo-genotypes/'))
    expect(restored.sort()).toEqual(demoManifest().map(entry => `seed/demo-genotypes/${entry.file}`).sort())
  })

  it('401 anonymous, 200 for every role, 404 for another agency, 422 for an unknown method', async () => {
    const path = `/api/species/${records.speciesId}/fst`
    expectErrorAnswer(await clients.anonymous.get(path), 401)
    for (const role of ['viewer', 'biologist', 'manager', 'administrator'] as const) {
      expect((await clients[role].get(path)).status, role).toBe(200)
    }
    expectErrorAnswer(await clients.otherAdmin.get(path), 404, /Species not found/)
    expectErrorAnswer(await clients.viewer.get(`${path}?method=nei`), 422, /hudson/)
    expectErrorAnswer(await clients.viewer.get(`${path}?markerType=allozyme`), 422)
    expectErrorAnswer(await clients.viewer.get('/api/species/999999/fst'), 404)
  })

  for (const method of ['hudson', 'weir-cockerham'] as const) {
    it(`${method}: values equal the engine's fstMatrix for the same datasets`, async () => {
      const response = await clients.viewer.get(`/api/species/${records.speciesId}/fst?method=${method}`)
      expect(response.status).toBe(200)
      const { named, matrix } = engineMatrix(method)
      expect(response.body.method).toBe(method)
      expect(response.body.markerType).toBe('microsatellite')
      expect(response.body.populations.map((p: { name: string }) => p.name)).toEqual(named.map(entry => entry.name))
      expect(response.body.values).toEqual(matrix.values)
      // One entry checked against pairwiseFst directly, and the matrix is symmetric with a 0 diagonal.
      const direct = pairwiseFst(named[0]!.dataset, named[1]!.dataset, { method }).fst // six populations
      expect(response.body.values[0][1]).toBe(direct)
      expect(response.body.values[1][0]).toBe(direct)
      expect(response.body.values[2][2]).toBe(0)
      expect(response.body.sharedLoci[0][1]).toBe(12)
    })
  }

  it('a dataset sharing no locus with the others is left out of the matrix and listed', async () => {
    const id = records.subpopulations['Stonelantern Flats']!
    const upload = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'other-panel.csv', content: 'id,X1_1,X1_2\nS1,1,2\nS2,1,1\n' }, { markerType: 'microsatellite' })
    expect(upload.status).toBe(201)
    const response = await clients.viewer.get(`/api/species/${records.speciesId}/fst`)
    expect(response.body.notCompared).toEqual([{ subpopulationId: id, name: 'Stonelantern Flats', datasetId: upload.body.id }])
    expect(response.body.populations.map((p: { name: string }) => p.name)).not.toContain('Stonelantern Flats')
    expect(response.body.values).toEqual(engineMatrix('hudson').matrix.values)
    expect((await clients.biologist.delete(`/api/genotypes/${upload.body.id}`)).status).toBe(204)
  })

  it('chooses the marker type: SNP datasets form their own matrix', async () => {
    const silverthread = records.subpopulations['Silverthread Branch']!
    const lanternmoss = records.subpopulations['Lanternmoss Gap']!
    for (const id of [silverthread, lanternmoss]) {
      const upload = await uploadForm(clients.biologist, `/api/subpopulations/${id}/genotypes`, { name: 'panel.vcf', content: SMALL_VCF }, { markerType: 'snp' })
      expect(upload.status).toBe(201)
    }
    const microsatellites = await clients.viewer.get(`/api/species/${records.speciesId}/fst`)
    expect(microsatellites.body.markerType).toBe('microsatellite')
    expect(microsatellites.body.markerTypes).toEqual([{ markerType: 'microsatellite', subpopulations: 6 }, { markerType: 'snp', subpopulations: 2 }])
    const snps = await clients.viewer.get(`/api/species/${records.speciesId}/fst?markerType=snp&method=weir-cockerham`)
    expect(snps.body.populations.map((p: { name: string }) => p.name)).toEqual(['Lanternmoss Gap', 'Silverthread Branch'])
    // The same file twice: θ of a sample with itself is ≤ 0 (pairwiseFst documents it), never NaN.
    const dataset = (await import('../../shared/genetics/index')).parseVcf(SMALL_VCF)
    if (!('dataset' in dataset)) throw new Error('SMALL_VCF parses')
    expect(snps.body.values[0][1]).toBe(pairwiseFst(dataset.dataset, dataset.dataset, { method: 'weir-cockerham' }).fst)
  })
})
