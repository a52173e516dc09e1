/**
 * Dataset validation (plain-word problems with positions), the engine's
 * RangeError policy, and degenerate inputs (missing loci, unshared loci,
 * tiny samples).
 */
import { describe, expect, it } from 'vitest'
import {
  allelicRichness,
  fstMatrix,
  type GenotypeDataset,
  MAX_LISTED_PROBLEMS,
  pairwiseFst,
  privateAlleles,
  smallestGeneCount,
  summarizeGenotypes,
  validateGenotypeDataset,
} from '../../../shared/genetics/genotypes'

const small: GenotypeDataset = {
  loci: ['Loc1', 'Loc2'],
  individuals: [
    { id: 'A1', genotypes: [['101', '103'], ['200', '200']] },
    { id: 'A2', genotypes: [['101', '101'], null] },
    { id: 'A3', genotypes: [['103', '105'], ['200', '210']] },
  ],
}

describe('validateGenotypeDataset', () => {
  it('accepts a well-formed dataset with missing genotypes', () => {
    expect(validateGenotypeDataset(small)).toEqual({ ok: true })
  })

  it('names the individual and locus of each problem in plain words', () => {
    const result = validateGenotypeDataset({
      loci: ['Loc1', 'Loc2', 'Loc1', ''],
      individuals: [
        { id: 'A1', genotypes: [['101', ''], ['1', '2', '3'], ['1'], null] },
        { id: 'A1', genotypes: [null, [' 1', '2'], [101, '2'], 'x'] },
        { id: '', genotypes: [null, null] },
        { genotypes: null },
      ],
    })
    expect(result).toEqual({
      ok: false,
      problems: [
        { locus: 'Loc1', message: 'locus "Loc1" appears more than once in the list of loci' },
        { message: 'locus number 4 has no name (got "")' },
        { individual: 'A1', locus: 'Loc1', message: 'individual "A1" at locus "Loc1" has an empty allele ""; use null for a missing genotype' },
        { individual: 'A1', locus: 'Loc2', message: 'individual "A1" at locus "Loc2" has 3 allele(s); only diploid genotypes (ploidy 2) are supported' },
        { individual: 'A1', locus: 'Loc1', message: 'individual "A1" at locus "Loc1" has 1 allele(s); only diploid genotypes (ploidy 2) are supported' },
        { individual: 'A1', message: 'individual "A1" appears more than once (numbers 1 and 2)' },
        { individual: 'A1', locus: 'Loc2', message: 'individual "A1" at locus "Loc2" has allele " 1" with spaces around it' },
        { individual: 'A1', locus: 'Loc1', message: 'individual "A1" at locus "Loc1" has allele number 101; alleles must be text such as "101"' },
        { individual: 'A1', locus: '', message: 'individual "A1" at locus "" has genotype "x"; expected two alleles or null' },
        { message: 'individual number 3 has no id (got "")' },
        { message: 'individual number 3 has 2 genotypes but the dataset has 4 loci' },
        { message: 'individual number 4 has no id (got nothing)' },
        { message: 'individual number 4 needs "genotypes", a list with one entry per locus, got null' },
      ],
    })
  })

  it('reports a locus-count mismatch and empty or malformed datasets', () => {
    expect(validateGenotypeDataset({ loci: ['L1', 'L2'], individuals: [{ id: 'A', genotypes: [null] }] })).toEqual({
      ok: false,
      problems: [{ individual: 'A', message: 'individual "A" has 1 genotypes but the dataset has 2 loci' }],
    })
    expect(validateGenotypeDataset({ loci: [], individuals: [] })).toEqual({
      ok: false,
      problems: [{ message: 'the dataset has no loci' }, { message: 'the dataset has no individuals' }],
    })
    expect(validateGenotypeDataset(null)).toEqual({ ok: false, problems: [{ message: 'the dataset must be an object with "loci" and "individuals", got null' }] })
    expect(validateGenotypeDataset({ loci: 'L1', individuals: {} })).toMatchObject({ ok: false, problems: [{ message: expect.stringContaining('"loci"') }, { message: expect.stringContaining('"individuals"') }] })
  })

  it(`lists at most ${MAX_LISTED_PROBLEMS} problems, then how many more`, () => {
    const individuals = Array.from({ length: 130 }, (_, index) => ({ id: `I${index}`, genotypes: [['', '1']] }))
    const result = validateGenotypeDataset({ loci: ['L'], individuals })
    if (result.ok) throw new Error('expected problems')
    expect(result.problems).toHaveLength(MAX_LISTED_PROBLEMS + 1)
    expect(result.problems.at(-1)).toEqual({ message: '30 more problems not listed' })
  })
})

describe('engine RangeError policy', () => {
  const invalid = { loci: ['L'], individuals: [{ id: 'A', genotypes: [['1', '']] }] } as GenotypeDataset

  it('every summary rejects an invalid dataset, naming the first problem', () => {
    expect(() => summarizeGenotypes(invalid)).toThrow(new RangeError('summarizeGenotypes: dataset must be a valid genotype dataset, got individual "A" at locus "L" has an empty allele ""; use null for a missing genotype'))
    expect(() => allelicRichness(invalid, 1)).toThrow(RangeError)
    expect(() => pairwiseFst(small, invalid, { method: 'hudson' })).toThrow(/^pairwiseFst: second must be a valid genotype dataset/)
    expect(() => privateAlleles({ a: small, b: invalid })).toThrow(/^privateAlleles: datasets\["b"\] must be a valid genotype dataset/)
    expect(() => fstMatrix([{ name: 'a', dataset: invalid }], { method: 'hudson' })).toThrow(/^fstMatrix: datasets\[0\]\.dataset must be/)
    expect(() => smallestGeneCount(invalid)).toThrow(RangeError)
  })

  it('allelicRichness needs an integer g in [1, smallest per-locus gene count]', () => {
    expect(smallestGeneCount(small)).toEqual({ geneCount: 4, locus: 'Loc2' })
    expect(() => allelicRichness(small, 0)).toThrow(new RangeError('allelicRichness: rarefactionSize must be an integer ≥ 1, got 0'))
    expect(() => allelicRichness(small, 2.5)).toThrow(RangeError)
    expect(() => allelicRichness(small, Number.NaN)).toThrow(RangeError)
    expect(() => allelicRichness(small, 5)).toThrow(new RangeError('allelicRichness: rarefactionSize must be ≤ 4, the smallest per-locus gene count (locus "Loc2"), got 5'))
    // By hand, Loc1 (101×3, 103×2, 105×1 in 6 copies), g = 4: 1 + (1 − 1/15) + (1 − 5/15) = 39/15.
    const [loc1, loc2] = allelicRichness(small, 4).loci
    expect(loc1?.richness).toBeCloseTo(39 / 15, 15)
    expect(loc2?.richness).toBe(2) // Loc2 has exactly 4 copies: the full sample
    const noData: GenotypeDataset = { loci: ['L', 'M'], individuals: [{ id: 'A', genotypes: [['1', '2'], null] }] }
    expect(() => allelicRichness(noData, 1)).toThrow(/must be ≤ 0, the smallest per-locus gene count \(locus "M"\)/)
  })

  it('pairwiseFst and fstMatrix reject unknown methods; fstMatrix rejects duplicate names', () => {
    expect(() => pairwiseFst(small, small, { method: 'nei' as 'hudson' })).toThrow(new RangeError('pairwiseFst: options.method must be "hudson" or "weir-cockerham", got nei'))
    expect(() => fstMatrix([{ name: 'x', dataset: small }, { name: 'x', dataset: small }], { method: 'hudson' })).toThrow(/fstMatrix: datasets\[\]\.name must be unique, got x/)
    expect(fstMatrix([], { method: 'weir-cockerham' })).toEqual({ method: 'weir-cockerham', names: [], values: [] })
  })

  it('privateAlleles needs two populations', () => {
    expect(() => privateAlleles({ only: small })).toThrow(new RangeError('privateAlleles: datasets must be at least two populations, got 1'))
  })
})

describe('degenerate inputs', () => {
  const partial: GenotypeDataset = {
    loci: ['Loc1', 'Loc2', 'Gone'],
    individuals: [
      { id: 'B1', genotypes: [['101', '105'], null, null] },
      { id: 'B2', genotypes: [['105', '105'], null, null] },
    ],
  }

  it('a locus nobody was genotyped at has null diversity and stays out of the means', () => {
    const summary = summarizeGenotypes(partial)
    expect(summary.loci[1]).toMatchObject({ sampleSize: 0, alleleCount: 0, observedHeterozygosity: null, expectedHeterozygosity: null, inbreedingCoefficient: null })
    expect(summary.overall.lociWithoutData).toEqual(['Loc2', 'Gone'])
    expect(summary.overall.lociInMeans).toEqual(['Loc1'])
    expect(summary.overall.missingGenotypeFraction).toBeCloseTo(4 / 6, 15)
    expect(summary.overall.meanObservedHeterozygosity).toBe(0.5)
  })

  it('F_ST skips loci without data in one population and lists loci only one dataset has', () => {
    const hudson = pairwiseFst(small, partial, { method: 'hudson' })
    expect(hudson.loci.map(locus => locus.locus)).toEqual(['Loc1'])
    expect(hudson.skippedLoci).toEqual([{ locus: 'Loc2', reason: 'no genotyped individual in the second population' }])
    expect(hudson.unsharedLoci).toEqual(['Gone'])
    expect(privateAlleles({ small, partial })).toEqual({
      sharedLoci: ['Loc1'],
      skippedLoci: ['Loc2'],
      populations: { small: { count: 1, alleles: [{ locus: 'Loc1', allele: '103' }] }, partial: { count: 0, alleles: [] } },
    })
  })

  it('Weir & Cockerham needs n̄ > 1: one individual in each population is skipped', () => {
    const one = (id: string, genotype: [string, string]): GenotypeDataset => ({ loci: ['L'], individuals: [{ id, genotypes: [genotype] }] })
    const result = pairwiseFst(one('a', ['1', '2']), one('b', ['2', '3']), { method: 'weir-cockerham' })
    expect(result.fst).toBeNull()
    expect(result.skippedLoci).toEqual([{ locus: 'L', reason: 'only one genotyped individual in each population (n̄ − 1 = 0)' }])
    // Hudson is defined with one individual each: H_w = ½(1 + 1), H_b = 1 − ¼ → F_ST = 1 − 1/(3/4) = −1/3.
    expect(pairwiseFst(one('a', ['1', '2']), one('b', ['2', '3']), { method: 'hudson' }).fst).toBeCloseTo(-1 / 3, 15)
  })

  it('no shared loci gives a null estimate, not NaN', () => {
    const other: GenotypeDataset = { loci: ['X'], individuals: [{ id: 'c', genotypes: [['1', '2']] }] }
    const result = pairwiseFst(small, other, { method: 'weir-cockerham' })
    expect(result).toMatchObject({ fst: null, totalInbreeding: null, withinPopulationInbreeding: null, loci: [], unsharedLoci: ['Loc1', 'Loc2', 'X'] })
  })

  it('lists alleles numerically first ("99" before "101"), then text, without depending on the locale', () => {
    const mixed: GenotypeDataset = {
      loci: ['L'],
      individuals: [
        { id: 'a', genotypes: [['101', '99']] },
        { id: 'b', genotypes: [['G', 'A']] },
        { id: 'c', genotypes: [['7', '07']] },
      ],
    }
    expect(summarizeGenotypes(mixed).loci[0]?.alleleCounts.map(entry => entry.allele)).toEqual(['07', '7', '99', '101', 'A', 'G'])
    const other: GenotypeDataset = { loci: ['L'], individuals: [{ id: 'z', genotypes: [['5', '5']] }] }
    expect(privateAlleles({ mixed, other }).populations.mixed?.alleles.map(entry => entry.allele)).toEqual(['07', '7', '99', '101', 'A', 'G'])
  })

  it('does not change its inputs', () => {
    const before = JSON.stringify(small)
    summarizeGenotypes(small)
    allelicRichness(small, 3)
    pairwiseFst(small, small, { method: 'weir-cockerham' })
    privateAlleles({ a: small, b: small })
    expect(JSON.stringify(small)).toBe(before)
  })
})
