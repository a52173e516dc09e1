/**
 * Property tests (fast-check) for the genotype summaries: ranges, degenerate
 * loci, what theory says F_ST estimators give for a sample compared with
 * itself, symmetry, and the shape of the rarefaction curve (checked against
 * exact binomial coefficients in BigInt).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  allelicRichness,
  type Genotype,
  type GenotypeDataset,
  pairwiseFst,
  summarizeGenotypes,
} from '../../../shared/genetics/genotypes'

const ALLELES = ['99', '101', '103', '105', '107', 'A', 'G'] as const
const allele = fc.constantFrom(...ALLELES)
const genotype: fc.Arbitrary<Genotype> = fc.tuple(allele, allele)

function buildDataset(rows: (Genotype | null)[][], locusCount: number): GenotypeDataset {
  return {
    loci: Array.from({ length: locusCount }, (_, index) => `L${index + 1}`),
    individuals: rows.map((genotypes, index) => ({ id: `I${index + 1}`, genotypes })),
  }
}

/** Datasets with 1–4 loci, 1–14 individuals and about one genotype in five missing. */
const datasetWithMissing = fc.integer({ min: 1, max: 4 }).chain(locusCount =>
  fc.array(fc.array(fc.option(genotype, { nil: null, freq: 5 }), { minLength: locusCount, maxLength: locusCount }), { minLength: 1, maxLength: 14 })
    .map(rows => buildDataset(rows, locusCount)))

/** Complete datasets (no missing genotype) with at least `minIndividuals` individuals. */
const completeDataset = (minIndividuals: number) => fc.integer({ min: 1, max: 4 }).chain(locusCount =>
  fc.array(fc.array(genotype, { minLength: locusCount, maxLength: locusCount }), { minLength: minIndividuals, maxLength: 14 })
    .map(rows => buildDataset(rows, locusCount)))

const inUnitInterval = (value: number | null) => value === null || (value >= 0 && value <= 1)

describe('heterozygosities', () => {
  it('Ho and every He estimate lie in [0, 1]; they are null only at loci without data', () => {
    fc.assert(fc.property(datasetWithMissing, (dataset) => {
      for (const locus of summarizeGenotypes(dataset).loci) {
        const values = [locus.observedHeterozygosity, locus.expectedHeterozygosity, locus.expectedHeterozygosityPlugIn, locus.expectedHeterozygosityNei1987]
        expect(values.every(inUnitInterval)).toBe(true)
        expect(values.every(value => value === null)).toBe(locus.sampleSize === 0)
        expect(locus.inbreedingCoefficient === null).toBe(locus.sampleSize === 0 || locus.expectedHeterozygosity === 0)
        if (locus.inbreedingCoefficient !== null) expect(Number.isFinite(locus.inbreedingCoefficient)).toBe(true)
      }
    }))
  })

  it('a monomorphic locus has He = 0 (every estimator) and no F_IS; it is averaged unless excluded', () => {
    fc.assert(fc.property(completeDataset(1), allele, (dataset, fixedAllele) => {
      const withFixedLocus: GenotypeDataset = {
        loci: [...dataset.loci, 'fixed'],
        individuals: dataset.individuals.map(individual => ({ ...individual, genotypes: [...individual.genotypes, [fixedAllele, fixedAllele]] })),
      }
      const summary = summarizeGenotypes(withFixedLocus)
      const fixed = summary.loci.at(-1)
      expect(fixed?.monomorphic).toBe(true)
      expect(fixed?.expectedHeterozygosity).toBe(0)
      expect(fixed?.expectedHeterozygosityPlugIn).toBe(0)
      expect(fixed?.expectedHeterozygosityNei1987).toBe(0)
      expect(fixed?.observedHeterozygosity).toBe(0)
      expect(fixed?.inbreedingCoefficient).toBeNull()
      expect(summary.overall.lociInMeans).toContain('fixed')
      const excluded = summarizeGenotypes(withFixedLocus, { includeMonomorphicLoci: false })
      expect(excluded.includesMonomorphicLoci).toBe(false)
      expect(excluded.overall.lociInMeans).not.toContain('fixed')
    }))
  })

  it('multi-locus F_IS is 1 − mean(Ho)/mean(He) over the averaged loci', () => {
    fc.assert(fc.property(datasetWithMissing, (dataset) => {
      const { overall } = summarizeGenotypes(dataset)
      if (overall.meanExpectedHeterozygosity === null || overall.meanExpectedHeterozygosity === 0) {
        expect(overall.inbreedingCoefficient).toBeNull()
        return
      }
      const expected = 1 - (overall.meanObservedHeterozygosity ?? 0) / overall.meanExpectedHeterozygosity
      expect(Math.abs((overall.inbreedingCoefficient ?? Number.NaN) - expected)).toBeLessThanOrEqual(1e-14 * Math.max(1, Math.abs(expected)))
    }))
  })
})

describe('F_ST of a sample with itself (what the estimators give, not 0)', () => {
  it('Hudson: exactly −1/(2n − 1) when every locus has n individuals, since H_w = 2n/(2n − 1)·H_b', () => {
    fc.assert(fc.property(completeDataset(1), (dataset) => {
      const result = pairwiseFst(dataset, dataset, { method: 'hudson' })
      const geneCount = 2 * dataset.individuals.length
      const polymorphic = summarizeGenotypes(dataset).loci.some(locus => !locus.monomorphic)
      if (!polymorphic) {
        expect(result.fst).toBeNull()
        return
      }
      const expected = -1 / (geneCount - 1)
      expect(Math.abs((result.fst ?? Number.NaN) - expected)).toBeLessThanOrEqual(32 * Number.EPSILON * Math.abs(expected)) // sums over ≤ 4 loci
    }))
  })

  it('Hudson with missing data: 1 − Σ He(Nei 1978)/Σ He(plug-in) ≤ 0', () => {
    fc.assert(fc.property(datasetWithMissing, (dataset) => {
      const result = pairwiseFst(dataset, dataset, { method: 'hudson' })
      const used = summarizeGenotypes(dataset).loci.filter(locus => locus.sampleSize > 0)
      const unbiased = used.reduce((sum, locus) => sum + (locus.expectedHeterozygosity ?? 0), 0)
      const plugIn = used.reduce((sum, locus) => sum + (locus.expectedHeterozygosityPlugIn ?? 0), 0)
      if (plugIn === 0) {
        expect(result.fst).toBeNull()
        return
      }
      expect(result.fst).toBeLessThan(0)
      expect(Math.abs((result.fst ?? Number.NaN) - (1 - unbiased / plugIn))).toBeLessThanOrEqual(1e-14)
    }))
  })

  it('Weir & Cockerham: θ = −Σ(Hₗ − Hoₗ/2)/(nₗ − 1) / ΣHₗ ≤ 0 (s² = 0, n_c = n̄ = n; H = plug-in He)', () => {
    fc.assert(fc.property(datasetWithMissing, (dataset) => {
      const result = pairwiseFst(dataset, dataset, { method: 'weir-cockerham' })
      const used = summarizeGenotypes(dataset).loci.filter(locus => locus.sampleSize >= 2)
      let numerator = 0
      let denominator = 0
      for (const locus of used) {
        const plugIn = locus.expectedHeterozygosityPlugIn ?? 0
        numerator -= (plugIn - (locus.observedHeterozygosity ?? 0) / 2) / (locus.sampleSize - 1)
        denominator += plugIn
      }
      if (denominator === 0) {
        expect(result.fst).toBeNull()
        return
      }
      expect(result.fst).toBeLessThanOrEqual(1e-14)
      expect(Math.abs((result.fst ?? Number.NaN) - numerator / denominator)).toBeLessThanOrEqual(1e-12)
    }))
  })
})

describe('pairwise F_ST symmetry', () => {
  it('swapping the populations gives identical per-locus terms and multi-locus values (same locus order)', () => {
    fc.assert(fc.property(datasetWithMissing, datasetWithMissing, (first, second) => {
      for (const method of ['hudson', 'weir-cockerham'] as const) {
        const forward = pairwiseFst(first, second, { method })
        const backward = pairwiseFst(second, first, { method })
        expect(backward.fst).toBe(forward.fst)
        expect(backward.loci.map(locus => locus.fst)).toEqual(forward.loci.map(locus => locus.fst))
      }
    }))
  })

  it('with the loci in a different order the estimate agrees to rounding', () => {
    fc.assert(fc.property(datasetWithMissing, datasetWithMissing, (first, second) => {
      const reversed: GenotypeDataset = {
        loci: [...second.loci].reverse(),
        individuals: second.individuals.map(individual => ({ ...individual, genotypes: [...individual.genotypes].reverse() })),
      }
      for (const method of ['hudson', 'weir-cockerham'] as const) {
        const forward = pairwiseFst(first, second, { method }).fst
        const backward = pairwiseFst(reversed, first, { method }).fst
        if (forward === null) expect(backward).toBeNull()
        else expect(Math.abs((backward ?? Number.NaN) - forward)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(forward)))
      }
    }))
  })

  it('F_ST ≤ 1 and is 1 for populations fixed for different alleles at every locus', () => {
    fc.assert(fc.property(datasetWithMissing, datasetWithMissing, (first, second) => {
      for (const method of ['hudson', 'weir-cockerham'] as const) {
        const fst = pairwiseFst(first, second, { method }).fst
        if (fst !== null) expect(fst).toBeLessThanOrEqual(1 + 1e-12)
      }
    }))
    const fixed = (label: string, size: number): GenotypeDataset => buildDataset(Array.from({ length: size }, () => [[label, label]]), 1)
    expect(pairwiseFst(fixed('A', 3), fixed('G', 5), { method: 'hudson' }).fst).toBe(1)
    expect(pairwiseFst(fixed('A', 3), fixed('G', 5), { method: 'weir-cockerham' }).fst).toBeCloseTo(1, 14)
    expect(pairwiseFst(fixed('A', 3), fixed('A', 5), { method: 'hudson' }).fst).toBeNull()
    expect(pairwiseFst(fixed('A', 3), fixed('A', 5), { method: 'weir-cockerham' }).fst).toBeNull()
  })
})

// ---------------------------------------------------------------- rarefaction
function binomial(n: number, k: number): bigint {
  if (k < 0 || k > n) return 0n
  let result = 1n
  for (let i = 0; i < k; i++) result = result * BigInt(n - i) / BigInt(i + 1)
  return result
}

/** A(g) from exact BigInt binomial coefficients: an independent route to eq. 8.1. */
function exactRichness(copies: number[], size: number): number {
  const total = copies.reduce((sum, count) => sum + count, 0)
  const all = binomial(total, size)
  return copies.reduce((sum, count) => sum + 1 - Number(binomial(total - count, size) * 10n ** 30n / all) / 1e30, 0)
}

describe('allelic richness by rarefaction', () => {
  it('matches exact binomial coefficients, grows with g, lies in [1, min(g, alleles)] and equals the allele count at full size', () => {
    fc.assert(fc.property(completeDataset(1), (dataset) => {
      const geneCount = 2 * dataset.individuals.length
      const counts = summarizeGenotypes(dataset).loci.map(locus => locus.alleleCounts.map(entry => entry.count))
      let previous: number[] = []
      for (let size = 1; size <= geneCount; size++) {
        const result = allelicRichness(dataset, size)
        result.loci.forEach((locus, index) => {
          expect(Math.abs(locus.richness - exactRichness(counts[index] ?? [], size))).toBeLessThanOrEqual(1e-13)
          expect(locus.richness).toBeGreaterThanOrEqual(1 - 1e-14)
          expect(locus.richness).toBeLessThanOrEqual(Math.min(size, locus.alleleCount) + 1e-14)
          expect(locus.richness).toBeGreaterThanOrEqual((previous[index] ?? 0) - 1e-14)
        })
        previous = result.loci.map(locus => locus.richness)
      }
      const full = allelicRichness(dataset, geneCount)
      for (const locus of full.loci) expect(locus.richness).toBe(locus.alleleCount)
    }), { numRuns: 60 })
  })

  it('is strictly increasing in g while some allele can still be missed', () => {
    const dataset = buildDataset([[['101', '103']], [['101', '101']], [['105', '101']], [['101', '101']]], 1)
    const curve = Array.from({ length: 8 }, (_, index) => allelicRichness(dataset, index + 1).meanRichness)
    for (let index = 1; index < curve.length; index++) expect(curve[index]).toBeGreaterThan(curve[index - 1] ?? Number.POSITIVE_INFINITY)
    expect(curve.at(-1)).toBe(3)
  })

  it('keeps full relative precision for a rare allele in a large sample (no 1 − (1 − x) cancellation)', () => {
    // 10 000 gene copies, one copy of a rare allele; P(sampled in g = 3) = 3/10 000 exactly.
    const individuals = Array.from({ length: 5000 }, (_, index) => ({ id: `I${index}`, genotypes: [index === 0 ? ['1', '2'] : ['1', '1']] as Genotype[] }))
    const result = allelicRichness({ loci: ['L'], individuals }, 3)
    const expected = 1 + 3 / 10000 // allele 1 is always sampled (C(1, 3) = 0)
    expect(Math.abs((result.loci[0]?.richness ?? 0) - expected)).toBeLessThanOrEqual(2 * Number.EPSILON)
  })
})
