/**
 * Genotype summaries against reference values:
 * - SCIENCE.md §8.2/§8.3 and §11 rows 46–51 (independent mpmath reference computation),
 * - an invented three-population dataset recomputed in exact rationals by
 *   tests/fixtures/genetics/reference/genotypes_reference.py,
 * - the scikit-allel documentation example (§11 row 52).
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import {
  allelicRichness,
  fstMatrix,
  type GenotypeDataset,
  pairwiseFst,
  privateAlleles,
  summarizeGenotypes,
} from '../../../shared/genetics/genotypes'

const EPS = Number.EPSILON

function fixture<T>(name: string): T {
  return JSON.parse(readFileSync(new URL(`../../fixtures/genetics/${name}`, import.meta.url), 'utf8')) as T
}

type Expected
  = | { fraction: string }
    | { computed: number }
    | { printed: number, decimals: number }

function fractionValue(text: string): number {
  const [numerator, denominator] = text.split('/').map(Number)
  return (numerator ?? Number.NaN) / (denominator ?? Number.NaN)
}

/** Compares with the tolerance the fixture states for each kind of value. */
function expectValue(actual: number | null | undefined, expected: Expected, label: string): void {
  expect(actual, label).toBeTypeOf('number')
  const value = actual as number
  if ('fraction' in expected) {
    const exact = fractionValue(expected.fraction)
    expect(Math.abs(value - exact), `${label}: ${value} vs ${expected.fraction}`).toBeLessThanOrEqual(16 * EPS * Math.max(Math.abs(exact), 1))
  } else if ('computed' in expected) {
    expect(Math.abs(value - expected.computed), `${label}: ${value} vs ${expected.computed}`).toBeLessThanOrEqual(1e-12 * Math.abs(expected.computed))
  } else {
    // Half a unit of the last printed decimal; the factor keeps exact ties (0.4921875 → 0.492188) inside.
    expect(Math.abs(value - expected.printed), `${label}: ${value} vs ${expected.printed}`).toBeLessThanOrEqual(0.5 * 10 ** -expected.decimals * (1 + 1e-9))
  }
}

function pathValue(root: unknown, path: string): number | null | undefined {
  let node: unknown = root
  for (const key of path.split('.')) node = (node as Record<string, unknown>)[key]
  return node as number | null | undefined
}

// ---------------------------------------------------------------- SCIENCE.md §8
interface ScienceFixture {
  source: string
  populations: Record<string, { loci: string[], individuals: Record<string, string[]> }>
  summaries: Record<string, {
    loci: (Record<string, Expected> & { locus: string, alleleCounts: Record<string, number> })[]
    overall: Record<string, Expected>
  }>
  allelicRichness: {
    rarefactionSize: number
    extra: { population: string, locus: string, rarefactionSize: number, richness: Expected }
  } & Record<string, { observed: number[], richness: Expected[], meanRichness: Expected }>
  pairwise: {
    first: string
    second: string
    loci: { locus: string, a: number, b: number, c: number, theta: number, withinPopulationDiversity: number, betweenPopulationDiversity: number, hudsonFst: number }[]
    sums: { a: number, b: number, c: number }
    weirCockerhamTheta: number
    weirCockerhamTotalInbreeding: number
    weirCockerhamWithinInbreeding: number
    hudsonFst: number
  }
  privateAlleles: Record<string, { locus: string, allele: string }[]>
  vectors: { row: number, call: string, args: unknown[], path: string, expected: Expected }[]
}

const science = fixture<ScienceFixture>('genotypes-science.json')
const scienceData: Record<string, GenotypeDataset> = Object.fromEntries(
  Object.entries(science.populations).map(([name, table]) => [name, {
    loci: table.loci,
    individuals: Object.entries(table.individuals).map(([id, cells]) => ({
      id,
      genotypes: cells.map(cell => cell.split('/') as [string, string]),
    })),
  }]),
)
function scienceDataset(name: string): GenotypeDataset {
  const dataset = scienceData[name]
  if (!dataset) throw new Error(`no population ${name} in the fixture`)
  return dataset
}
const computed = (value: number): Expected => ({ computed: value })

describe('SCIENCE.md §8.3 (independent mpmath reference computation)', () => {
  it('names its source', () => {
    expect(science.source).toMatch(/independent mpmath reference computation \(SCIENCE\.md §8\)/)
  })

  for (const [population, expected] of Object.entries(science.summaries)) {
    it(`per-locus and mean diversity of ${population}`, () => {
      const summary = summarizeGenotypes(scienceDataset(population))
      expect(summary.expectedHeterozygosityEstimator).toBe('nei-1978-unbiased')
      expect(summary.includesMonomorphicLoci).toBe(true)
      expected.loci.forEach((locusExpected, index) => {
        const locus = summary.loci[index]
        expect(locus?.locus).toBe(locusExpected.locus)
        expect(Object.fromEntries((locus?.alleleCounts ?? []).map(entry => [entry.allele, entry.count]))).toEqual(locusExpected.alleleCounts)
        expect(locus?.sampleSize).toBe(scienceDataset(population).individuals.length)
        for (const key of ['observedHeterozygosity', 'expectedHeterozygosityPlugIn', 'expectedHeterozygosity', 'expectedHeterozygosityNei1987', 'inbreedingCoefficient'] as const) {
          const want = locusExpected[key]
          if (want) expectValue(locus?.[key], want, `${population} ${locusExpected.locus} ${key}`)
        }
      })
      for (const [key, want] of Object.entries(expected.overall)) {
        expectValue(pathValue(summary.overall, key), want, `${population} mean ${key}`)
      }
    })
  }

  it('allelic richness rarefied to the Alder Hollow sample size (g = 12)', () => {
    const g = science.allelicRichness.rarefactionSize
    for (const population of ['Alder Hollow', 'Cinder Flats']) {
      const expected = science.allelicRichness[population]
      const result = allelicRichness(scienceDataset(population), g)
      expect(result.loci.map(locus => locus.alleleCount)).toEqual(expected?.observed)
      expected?.richness.forEach((want, index) => expectValue(result.loci[index]?.richness, want, `${population} locus ${index + 1}`))
      if (expected) expectValue(result.meanRichness, expected.meanRichness, `${population} mean richness`)
    }
    const extra = science.allelicRichness.extra
    const locusIndex = scienceDataset(extra.population).loci.indexOf(extra.locus)
    expectValue(allelicRichness(scienceDataset(extra.population), extra.rarefactionSize).loci[locusIndex]?.richness, extra.richness, 'CF Loc3 g = 6')
  })

  it('Weir & Cockerham components and θ per locus and multi-locus, AH vs CF', () => {
    const p = science.pairwise
    const result = pairwiseFst(scienceDataset(p.first), scienceDataset(p.second), { method: 'weir-cockerham' })
    p.loci.forEach((want, index) => {
      const locus = result.loci[index]
      expect(locus?.locus).toBe(want.locus)
      expectValue(locus?.amongPopulations, computed(want.a), `${want.locus} a`)
      expectValue(locus?.amongIndividuals, computed(want.b), `${want.locus} b`)
      expectValue(locus?.withinIndividuals, computed(want.c), `${want.locus} c`)
      expectValue(locus?.fst, computed(want.theta), `${want.locus} θ`)
    })
    const sum = (pick: (locus: typeof result.loci[number]) => number) => result.loci.reduce((total, locus) => total + pick(locus), 0)
    expectValue(sum(locus => locus.amongPopulations), computed(p.sums.a), 'Σa')
    expectValue(sum(locus => locus.amongIndividuals), computed(p.sums.b), 'Σb')
    expectValue(sum(locus => locus.withinIndividuals), computed(p.sums.c), 'Σc')
    expectValue(result.fst, computed(p.weirCockerhamTheta), 'θ')
    expectValue(result.totalInbreeding, computed(p.weirCockerhamTotalInbreeding), 'F_IT')
    expectValue(result.withinPopulationInbreeding, computed(p.weirCockerhamWithinInbreeding), 'f')
    expect(result.skippedLoci).toEqual([])
    expect(result.unsharedLoci).toEqual([])
  })

  it('Hudson H_w, H_b and F_ST per locus, ratio of averages multi-locus, AH vs CF', () => {
    const p = science.pairwise
    const result = pairwiseFst(scienceDataset(p.first), scienceDataset(p.second), { method: 'hudson' })
    p.loci.forEach((want, index) => {
      const locus = result.loci[index]
      expectValue(locus?.withinPopulationDiversity, computed(want.withinPopulationDiversity), `${want.locus} H_w`)
      expectValue(locus?.betweenPopulationDiversity, computed(want.betweenPopulationDiversity), `${want.locus} H_b`)
      expectValue(locus?.fst, computed(want.hudsonFst), `${want.locus} F_ST`)
    })
    expectValue(result.fst, computed(p.hudsonFst), 'multi-locus F_ST')
    // The ratio of averages differs from the mean of per-locus ratios.
    const meanOfRatios = result.loci.reduce((total, locus) => total + (locus.fst ?? 0), 0) / result.loci.length
    expect(Math.abs(meanOfRatios - p.hudsonFst)).toBeGreaterThan(1e-6)
  })

  it('private alleles (counted by hand from the §8.2 table)', () => {
    const result = privateAlleles(scienceData)
    expect(result.sharedLoci).toEqual(['Loc1', 'Loc2', 'Loc3'])
    for (const population of ['Alder Hollow', 'Cinder Flats']) {
      expect(result.populations[population]?.alleles).toEqual(science.privateAlleles[population])
      expect(result.populations[population]?.count).toBe(science.privateAlleles[population]?.length)
    }
  })
})

describe('SCIENCE.md §11 test vectors, rows 46–51', () => {
  const resolve = (arg: unknown) => (typeof arg === 'string' ? scienceDataset(arg) : arg)
  for (const vector of science.vectors) {
    it(`row ${vector.row}: ${vector.call} → ${vector.path}`, () => {
      const args = vector.args.map(resolve)
      const result = vector.call === 'summarizeGenotypes'
        ? summarizeGenotypes(args[0] as GenotypeDataset)
        : vector.call === 'allelicRichness'
          ? allelicRichness(args[0] as GenotypeDataset, args[1] as number)
          : pairwiseFst(args[0] as GenotypeDataset, args[1] as GenotypeDataset, args[2] as { method: 'hudson' | 'weir-cockerham' })
      expectValue(pathValue(result, vector.path), vector.expected, `row ${vector.row}`)
    })
  }
})

// ---------------------------------------------------------------- exact-rational recomputation
interface ExactValue { exact: string, value: number }
interface ReferenceFixture {
  source: string
  datasets: { name: string, dataset: GenotypeDataset }[]
  summaries: Record<string, {
    loci: ({ locus: string, sampleSize: number, alleleCount: number, alleleCounts?: Record<string, number> } & Record<string, ExactValue | null | unknown>)[]
    overall: Record<string, ExactValue | null | number>
  }>
  allelicRichness: Record<string, { rarefactionSize: number, loci: { locus: string, geneCount: number, richness: ExactValue }[], meanRichness: ExactValue }>
  pairwise: Record<string, {
    sharedLoci: string[]
    hudson: { fst: ExactValue, loci: { locus: string, withinPairDifference: ExactValue, betweenPairDifference: ExactValue, fst: ExactValue | null }[] }
    weirCockerham: {
      theta: ExactValue
      totalInbreeding: ExactValue
      withinInbreeding: ExactValue
      loci: { locus: string, a: ExactValue, b: ExactValue, c: ExactValue, theta: ExactValue | null }[]
    }
  }>
  privateAlleles: { sharedLoci: string[], populations: Record<string, { count: number, alleles: { locus: string, allele: string }[] }> }
}

const reference = fixture<ReferenceFixture>('genotypes-reference.json')
const referenceData = Object.fromEntries(reference.datasets.map(entry => [entry.name, entry.dataset]))
function referenceDataset(name: string): GenotypeDataset {
  const dataset = referenceData[name]
  if (!dataset) throw new Error(`no population ${name} in the fixture`)
  return dataset
}

/** Fixture tolerance: the values are correctly rounded exact fractions; allow 16·eps of max(|x|, 1). */
function expectExact(actual: number | null | undefined, expected: ExactValue | null, label: string): void {
  if (expected === null) {
    expect(actual, label).toBeNull()
    return
  }
  expect(actual, label).toBeTypeOf('number')
  expect(Math.abs((actual as number) - expected.value), `${label}: ${actual} vs ${expected.exact}`)
    .toBeLessThanOrEqual(16 * EPS * Math.max(Math.abs(expected.value), 1))
}

describe('invented reed-vole dataset (independent exact-rational recomputation in python3 fractions)', () => {
  it('names its source script', () => {
    expect(reference.source).toMatch(/genotypes_reference\.py/)
  })

  for (const [population, expected] of Object.entries(reference.summaries)) {
    it(`summary of ${population}, with missing genotypes and a monomorphic locus`, () => {
      const summary = summarizeGenotypes(referenceDataset(population))
      expected.loci.forEach((want, index) => {
        const locus = summary.loci[index]
        expect(locus?.locus).toBe(want.locus)
        expect(locus?.sampleSize).toBe(want.sampleSize)
        expect(locus?.alleleCount).toBe(want.alleleCount)
        expect(Object.fromEntries((locus?.alleleCounts ?? []).map(entry => [entry.allele, entry.count]))).toEqual(want.alleleCounts)
        for (const key of ['observedHeterozygosity', 'expectedHeterozygosity', 'expectedHeterozygosityPlugIn', 'expectedHeterozygosityNei1987', 'inbreedingCoefficient'] as const) {
          expectExact(locus?.[key], want[key] as ExactValue | null, `${population} ${want.locus} ${key}`)
        }
      })
      for (const [key, want] of Object.entries(expected.overall)) {
        if (key === 'lociInMeans') expect(summary.overall.lociInMeans.length).toBe(want)
        else expectExact(pathValue(summary.overall, key), want as ExactValue | null, `${population} overall ${key}`)
      }
      expect(summary.overall.monomorphicLoci).toContain('Rv4')
    })
  }

  for (const [population, expected] of Object.entries(reference.allelicRichness)) {
    it(`allelic richness of ${population} rarefied to g = ${expected.rarefactionSize}`, () => {
      const result = allelicRichness(referenceDataset(population), expected.rarefactionSize)
      expected.loci.forEach((want, index) => {
        expect(result.loci[index]?.geneCount).toBe(want.geneCount)
        expectExact(result.loci[index]?.richness, want.richness, `${population} ${want.locus}`)
      })
      expectExact(result.meanRichness, expected.meanRichness, `${population} mean`)
    })
  }

  for (const [pair, expected] of Object.entries(reference.pairwise)) {
    const [first = '', second = ''] = pair.split('|')
    it(`Hudson and Weir & Cockerham F_ST, ${first} vs ${second} (loci matched by name)`, () => {
      const hudson = pairwiseFst(referenceDataset(first), referenceDataset(second), { method: 'hudson' })
      expect(hudson.loci.map(locus => locus.locus)).toEqual(expected.sharedLoci)
      expected.hudson.loci.forEach((want, index) => {
        const locus = hudson.loci[index]
        expectExact(locus?.withinPopulationDiversity, want.withinPairDifference, `${want.locus} H_w`)
        expectExact(locus?.betweenPopulationDiversity, want.betweenPairDifference, `${want.locus} H_b`)
        expectExact(locus?.fst, want.fst, `${want.locus} Hudson F_ST`)
      })
      expectExact(hudson.fst, expected.hudson.fst, 'Hudson multi-locus')

      const wc = pairwiseFst(referenceDataset(first), referenceDataset(second), { method: 'weir-cockerham' })
      expected.weirCockerham.loci.forEach((want, index) => {
        const locus = wc.loci[index]
        expect(locus?.locus).toBe(want.locus)
        expectExact(locus?.amongPopulations, want.a, `${want.locus} a`)
        expectExact(locus?.amongIndividuals, want.b, `${want.locus} b`)
        expectExact(locus?.withinIndividuals, want.c, `${want.locus} c`)
        expectExact(locus?.fst, want.theta, `${want.locus} θ`)
      })
      expectExact(wc.fst, expected.weirCockerham.theta, 'θ')
      expectExact(wc.totalInbreeding, expected.weirCockerham.totalInbreeding, 'F_IT')
      expectExact(wc.withinPopulationInbreeding, expected.weirCockerham.withinInbreeding, 'f')
    })
  }

  it('reports the locus only one population has as unshared', () => {
    const result = pairwiseFst(referenceDataset('North Fen'), referenceDataset('Tansy Marsh'), { method: 'hudson' })
    expect(result.unsharedLoci).toEqual(['Rv5'])
    expect(result.skippedLoci).toEqual([])
  })

  for (const method of ['hudson', 'weir-cockerham'] as const) {
    it(`fstMatrix (${method}) holds the pairwise values, symmetric with a zero diagonal`, () => {
      const matrix = fstMatrix(reference.datasets, { method })
      expect(matrix.names).toEqual(reference.datasets.map(entry => entry.name))
      matrix.names.forEach((rowName, row) => {
        expect(matrix.values[row]?.[row]).toBe(0)
        matrix.names.forEach((columnName, column) => {
          expect(matrix.values[row]?.[column]).toBe(matrix.values[column]?.[row])
          if (row >= column) return
          const expected = reference.pairwise[`${rowName}|${columnName}`]
          const want = method === 'hudson' ? expected?.hudson.fst : expected?.weirCockerham.theta
          expectExact(matrix.values[row]?.[column], want ?? null, `${rowName} vs ${columnName}`)
        })
      })
    })
  }

  it('private alleles over the loci every population shares', () => {
    expect(privateAlleles(referenceData)).toEqual({ ...reference.privateAlleles, skippedLoci: [] })
  })
})

// ---------------------------------------------------------------- library documentation example
interface LibraryFixture {
  source: string
  tolerance: { absolute: number }
  genotypes: [number, number][][]
  subpopulations: number[][]
  weirCockerham: {
    perAllele: { a: number[][], b: number[][], c: number[][] }
    perVariantFst: (number | null)[]
    overallFst: number
    section11Row52: { variant: number, a: number, b: number, c: number }
  }
  hudson: { numerator: number[], denominator: number[], perVariantFst: (number | null)[], overallFst: number }
}

const library = fixture<LibraryFixture>('genotypes-library-example.json')

function libraryPopulation(samples: number[]): GenotypeDataset {
  return {
    loci: library.genotypes.map((_, index) => `variant${index + 1}`),
    individuals: samples.map(sample => ({
      id: `sample${sample}`,
      genotypes: library.genotypes.map((variant) => {
        const call = variant[sample]
        if (!call || call[0] < 0) return null
        return [String(call[0]), String(call[1])] as [string, string]
      }),
    })),
  }
}

describe('scikit-allel documentation example (SCIENCE.md §8.1 library cross-check, §11 row 52)', () => {
  const [firstSamples = [], secondSamples = []] = library.subpopulations
  const first = libraryPopulation(firstSamples)
  const second = libraryPopulation(secondSamples)
  const tolerance = library.tolerance.absolute
  const closeTo = (actual: number | null | undefined, expected: number | null, label: string) => {
    if (expected === null) return expect(actual, label).toBeNull()
    expect(Math.abs((actual ?? Number.NaN) - expected), `${label}: ${actual} vs ${expected}`).toBeLessThanOrEqual(tolerance)
  }
  const rowSum = (rows: number[][], index: number) => (rows[index] ?? []).reduce((total, value) => total + value, 0)

  it('Weir & Cockerham a, b, c and θ per variant (missing call in variant 5)', () => {
    const result = pairwiseFst(first, second, { method: 'weir-cockerham' })
    const { perAllele } = library.weirCockerham
    result.loci.forEach((locus, index) => {
      closeTo(locus.amongPopulations, rowSum(perAllele.a, index), `${locus.locus} a`)
      closeTo(locus.amongIndividuals, rowSum(perAllele.b, index), `${locus.locus} b`)
      closeTo(locus.withinIndividuals, rowSum(perAllele.c, index), `${locus.locus} c`)
      closeTo(locus.fst, library.weirCockerham.perVariantFst[index] ?? null, `${locus.locus} θ`)
    })
    closeTo(result.fst, library.weirCockerham.overallFst, 'θ over all variants')
  })

  it('row 52: variant 4 gives a = −0.25, b = 0.375, c = 0.5', () => {
    const row = library.weirCockerham.section11Row52
    const locus = pairwiseFst(first, second, { method: 'weir-cockerham' }).loci[row.variant - 1]
    expect(Math.abs((locus?.amongPopulations ?? Number.NaN) - row.a)).toBeLessThanOrEqual(1e-12)
    expect(Math.abs((locus?.amongIndividuals ?? Number.NaN) - row.b)).toBeLessThanOrEqual(1e-12)
    expect(Math.abs((locus?.withinIndividuals ?? Number.NaN) - row.c)).toBeLessThanOrEqual(1e-12)
  })

  it('Hudson numerator H_b − H_w, denominator H_b and F_ST per variant and over variants', () => {
    const result = pairwiseFst(first, second, { method: 'hudson' })
    result.loci.forEach((locus, index) => {
      closeTo(locus.betweenPopulationDiversity - locus.withinPopulationDiversity, library.hudson.numerator[index] ?? Number.NaN, `${locus.locus} numerator`)
      closeTo(locus.betweenPopulationDiversity, library.hudson.denominator[index] ?? Number.NaN, `${locus.locus} denominator`)
      closeTo(locus.fst, library.hudson.perVariantFst[index] ?? null, `${locus.locus} F_ST`)
    })
    closeTo(result.fst, library.hudson.overallFst, 'F_ST over variants')
  })
})
