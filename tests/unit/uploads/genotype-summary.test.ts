/**
 * What the upload route stores (server/utils/genotype-summary.ts), on the invented worked
 * dataset of SCIENCE.md §8.2 (tests/fixtures/genetics/genotypes-science.json, whose "source"
 * names where each value comes from): richness rarefied to the smallest sample of the
 * comparison set, private alleles against the other subpopulations, which dataset is current,
 * datasets without shared loci left out, and file problems located by line and locus.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import type { GenotypeDataset } from '../../../shared/genetics/index'
import {
  compareSpeciesGenotypes,
  currentDatasetIds,
  decodeGenotypeText,
  readGenotypeText,
  summarizeGenotypeDataset,
  type ComparisonEntry,
} from '../../../server/utils/genotype-summary'

const fixture = JSON.parse(readFileSync(new URL('../../fixtures/genetics/genotypes-science.json', import.meta.url), 'utf8')) as {
  populations: Record<string, { loci: string[], individuals: Record<string, string[]> }>
  allelicRichness: { 'rarefactionSize': number, 'Cinder Flats': { meanRichness: { printed: number, decimals: number } } }
  privateAlleles: Record<string, { locus: string, allele: string }[]>
}

function datasetOf(name: string): GenotypeDataset {
  const population = fixture.populations[name]
  if (!population) throw new Error(name)
  return {
    loci: population.loci,
    individuals: Object.entries(population.individuals).map(([id, genotypes]) => ({
      id, genotypes: genotypes.map(pair => pair.split('/') as [string, string]),
    })),
  }
}

function entry(datasetId: number, subpopulationId: number, name: string, dataset: GenotypeDataset, extra: Partial<ComparisonEntry> = {}): ComparisonEntry {
  return {
    datasetId, subpopulationId, subpopulationName: name, markerType: 'microsatellite', sampledYear: 2024,
    createdAt: new Date('2025-01-01T00:00:00Z'), dataset, smallestGeneCount: summarizeGenotypeDataset(dataset).smallestGeneCount, ...extra,
  }
}

const alder = datasetOf('Alder Hollow')
const cinder = datasetOf('Cinder Flats')

describe('compareSpeciesGenotypes', () => {
  const results = compareSpeciesGenotypes([entry(1, 10, 'Alder Hollow', alder), entry(2, 20, 'Cinder Flats', cinder)])

  it('rarefies both to the smaller sample (12 gene copies, Alder Hollow) and matches SCIENCE.md §8.3', () => {
    const cf = results.get(2)?.richness
    expect(cf?.available).toBe(true)
    if (!cf?.available) return
    expect(cf.rarefactionSize).toBe(fixture.allelicRichness.rarefactionSize)
    expect(cf.limitedBy.subpopulationName).toBe('Alder Hollow')
    const printed = fixture.allelicRichness['Cinder Flats'].meanRichness
    expect(Math.abs(cf.result.meanRichness - printed.printed)).toBeLessThanOrEqual(0.5 * 10 ** -printed.decimals)
    const ah = results.get(1)?.richness
    expect(ah?.available && ah.rarefactionSize).toBe(12)
  })

  it('private alleles match the hand count of the fixture', () => {
    for (const [id, name] of [[1, 'Alder Hollow'], [2, 'Cinder Flats']] as const) {
      const list = results.get(id)?.privateAlleles
      expect(list?.available).toBe(true)
      if (!list?.available) continue
      expect(list.alleles).toEqual(fixture.privateAlleles[name])
      expect(list.count).toBe(1)
      expect(list.sharedLoci).toBe(3)
    }
  })

  it('a lone dataset: richness at its own smallest sample, private alleles not available', () => {
    const alone = compareSpeciesGenotypes([entry(1, 10, 'Alder Hollow', alder)]).get(1)
    expect(alone?.richness.available && alone.richness.rarefactionSize).toBe(12)
    expect(alone?.privateAlleles).toEqual({ available: false, reason: expect.stringMatching(/No other subpopulation has microsatellite data on these loci/) })
  })

  it('compares with the current dataset of each other subpopulation only, never across marker types or disjoint panels', () => {
    const older = entry(3, 20, 'Cinder Flats', alder, { sampledYear: 2010 })
    const snp = entry(4, 30, 'Snp Place', cinder, { markerType: 'snp' })
    const otherPanel = entry(5, 40, 'Other Panel', { loci: ['X'], individuals: [{ id: 'x', genotypes: [['1', '2']] }] })
    const all = compareSpeciesGenotypes([entry(1, 10, 'Alder Hollow', alder), entry(2, 20, 'Cinder Flats', cinder), older, snp, otherPanel])
    expect(all.get(1)?.comparedWith.map(c => c.datasetId)).toEqual([2])
    expect(all.get(1)?.withoutSharedLoci).toEqual(['Other Panel'])
    expect(all.get(3)?.current).toBe(false)
    expect(all.get(2)?.current).toBe(true)
    expect(all.get(3)?.comparedWith.map(c => c.datasetId)).toEqual([1])
    expect(all.get(4)?.comparedWith).toEqual([])
  })
})

describe('currentDatasetIds', () => {
  it('latest sampled year wins, then latest upload, then highest id; unknown year counts as oldest', () => {
    const base = { subpopulationId: 1, markerType: 'snp' as const }
    expect(currentDatasetIds([
      { ...base, datasetId: 1, sampledYear: 2020, createdAt: new Date('2025-01-02') },
      { ...base, datasetId: 2, sampledYear: null, createdAt: new Date('2025-06-01') },
      { ...base, datasetId: 3, sampledYear: 2021, createdAt: new Date('2024-01-01') },
    ])).toEqual(new Set([3]))
    expect(currentDatasetIds([
      { ...base, datasetId: 1, sampledYear: 2021, createdAt: new Date('2025-01-02') },
      { ...base, datasetId: 2, sampledYear: 2021, createdAt: new Date('2025-01-01') },
    ])).toEqual(new Set([1]))
  })
})

describe('readGenotypeText', () => {
  it('locates parse errors by line and locus', () => {
    const result = readGenotypeText('id,Loc1_1,Loc1_2,Loc2_1,Loc2_2\nA,101,103,200,200\nB,101,0,200,210\nC,1\n', 'csv')
    expect(result.ok).toBe(false)
    if (result.ok) return
    expect(result.message).toBe('Line 3: locus "Loc1": one allele is missing ("101" and "0"); give both alleles or mark both as missing (and 1 more problem)')
    expect(result.issues).toEqual([
      expect.objectContaining({ path: 'file', line: 3, locus: 'Loc1' }),
      { path: 'file', line: 4, message: 'Line 4: has 2 columns; the header has 5' },
    ])
  })

  it('reads a VCF and refuses UTF-8 errors', () => {
    const vcf = '##fileformat=VCFv4.2\n#CHROM\tPOS\tID\tREF\tALT\tQUAL\tFILTER\tINFO\tFORMAT\tS1\n1\t5\trs1\tA\tG\t.\tPASS\t.\tGT\t0/1\n'
    expect(readGenotypeText(vcf, 'vcf')).toEqual({ ok: true, dataset: { loci: ['rs1'], individuals: [{ id: 'S1', genotypes: [['A', 'G']] }] } })
    expect(decodeGenotypeText(new Uint8Array([0x61, 0xE9]))).toBeNull()
    expect(decodeGenotypeText(new TextEncoder().encode('ok'))).toBe('ok')
  })
})
