import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { offspringKinship } from '../../../shared/genetics/simulate/rescue/kinship'
import { founderPedigree, meanPedigreeInbreeding, offspringPedigree, withFounders } from '../../../shared/genetics/simulate/rescue/pedigree'
import { countAlleles } from '../../../shared/genetics/simulate/rescue/bit-counts'
import { dominanceFromSelection, dominanceRate } from '../../../shared/genetics/simulate/rescue/dominance'
import { reproductiveWeightShape } from '../../../shared/genetics/simulate/rescue/family-weights'
import { linkageLayout, setBitRange } from '../../../shared/genetics/simulate/rescue/linkage'
import { byteSums, equilibriumFrequency, genomeArchitecture } from '../../../shared/genetics/simulate/rescue/architecture'
import { rescuePlan } from '../../../shared/genetics/simulate/rescue/rescue-plan'
import { allocatePopulation } from '../../../shared/genetics/simulate/rescue/population'
import { gameteScratch, writeGamete } from '../../../shared/genetics/simulate/rescue/gamete'
import { evaluateFitness } from '../../../shared/genetics/simulate/rescue/evaluate'
import { replicateStream, sampleGamma, sharedStream } from '../../../shared/genetics/simulate/random'
import type { RescueParams } from '../../../shared/genetics/simulate/rescue'

const Z = 4

/** Kinship matrix of n unrelated, non-inbred founders: ½ on the diagonal, 0 elsewhere. */
function founderKinship(n: number): Float32Array {
  const kinship = new Float32Array(n * n)
  for (let i = 0; i < n; i++) kinship[i * n + i] = 0.5
  return kinship
}

describe('offspringKinship (pedigree coancestry, by definition)', () => {
  // Founders 0, 1 (female) and 2, 3 (male), unrelated and non-inbred.
  const founders = founderKinship(4)

  it('gives ¼ for full sibs, ⅛ for half sibs, 0 for unrelated and ½ for self', () => {
    // Children (mother × father): 0 and 1 are full sibs (0 × 2); 2 is their half sib through
    // mother 0 (0 × 3); 3 is a half sib of 0 and 1 through father 2 (1 × 2) and unrelated to 2.
    const kinship = offspringKinship(founders, 4, Int32Array.of(0, 0, 0, 1), Int32Array.of(2, 2, 3, 2))
    const at = (x: number, y: number): number => kinship[x * 4 + y] ?? Number.NaN
    expect(at(0, 1)).toBe(0.25)
    expect(at(0, 2)).toBe(0.125)
    expect(at(0, 3)).toBe(0.125) // half sibs through father 2
    expect(at(2, 3)).toBe(0)
    expect(at(1, 0)).toBe(at(0, 1))
    for (let x = 0; x < 4; x++) expect(at(x, x)).toBe(0.5)
  })

  it('gives F = ¼ to the offspring of full sibs', () => {
    const siblings = offspringKinship(founders, 4, Int32Array.of(0, 0), Int32Array.of(2, 2))
    const inbred = offspringKinship(siblings, 2, Int32Array.of(0), Int32Array.of(1))
    expect(2 * (inbred[0] ?? 0) - 1).toBe(0.25)
  })

  it('treats immigrants (numbers ≥ P) as unrelated founders', () => {
    // Children 0 and 1 share immigrant mother 4; child 2 has immigrant mother 5.
    const kinship = offspringKinship(founders, 4, Int32Array.of(4, 4, 5), Int32Array.of(2, 3, 2))
    expect(kinship[0 * 3 + 1]).toBe(0.125)
    expect(kinship[0 * 3 + 2]).toBe(0.125)
    expect(kinship[1 * 3 + 2]).toBe(0)
    expect(kinship[0]).toBe(0.5)
  })

  it('stores, generation after generation, exactly what the recurrence written out pair by pair gives', () => {
    // Reference: the recurrence itself, one pair at a time, in the operation order of the
    // doc comment (¼ of the four parent kinships added left to right), rounded to single
    // precision like the matrix (x < y, mirrored). Sizes that are not multiples of four exercise the last rows;
    // parent numbers ≥ P (immigrants) the general path.
    const recurrence = (parents: Float32Array, count: number, mothers: Int32Array, fathers: Int32Array): Float32Array => {
      const of = (a: number, b: number): number => (a < count && b < count ? parents[a * count + b] ?? Number.NaN : a === b ? 0.5 : 0)
      const size = mothers.length
      const result = new Float32Array(size * size)
      for (let x = 0; x < size; x++) {
        for (let y = x; y < size; y++) {
          const [mx, fx, my, fy] = [mothers[x] ?? 0, fathers[x] ?? 0, mothers[y] ?? 0, fathers[y] ?? 0]
          result[x * size + y] = x === y ? 0.5 * (1 + of(mx, fx)) : 0.25 * (of(mx, my) + of(mx, fy) + of(fx, my) + of(fx, fy))
          result[y * size + x] = result[x * size + y] ?? Number.NaN
        }
      }
      return result
    }
    fc.assert(fc.property(
      fc.integer({ min: 2, max: 41 }), fc.integer({ min: 1, max: 6 }), fc.boolean(), fc.integer({ min: 0, max: 2 ** 31 - 1 }),
      (firstSize, generations, immigrants, seed) => {
        const random = replicateStream(seed, 0)
        let size = firstSize
        let kinship = founderKinship(size)
        let reference = founderKinship(size)
        for (let generation = 0; generation < generations; generation++) {
          const next = 2 + ((random.next() >>> 0) % 40)
          const half = Math.ceil(size / 2)
          const pick = (from: number, count: number): number => from + ((random.next() >>> 0) % count)
          const mothers = Int32Array.from({ length: next }, () => (immigrants && (random.next() & 7) === 0 ? pick(size, 3) : pick(0, half)))
          const fathers = Int32Array.from({ length: next }, () => pick(half, size - half))
          kinship = offspringKinship(kinship, size, mothers, fathers)
          reference = recurrence(reference, size, mothers, fathers)
          size = next
          if (!kinship.every((value, index) => Object.is(value, reference[index]))) return false
        }
        return true
      },
    ), { numRuns: 300 })
  })
})

describe('pedigree among the parents that bred', () => {
  // Reference: the full offspring kinship matrix of every generation (offspringKinship), as
  // the model kept it before only breeders were tracked; F is read from its diagonal.
  const fullInbreeding = (kinship: Float32Array, size: number): number => {
    let sum = 0
    for (let x = 0; x < size; x++) sum += 2 * (kinship[x * size + x] ?? Number.NaN) - 1
    return sum / size
  }

  it('gives, generation after generation, the F that the full kinship matrix gives, with translocated founders and immigrants', () => {
    fc.assert(fc.property(fc.integer({ min: 2, max: 30 }), fc.integer({ min: 1, max: 8 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }), (firstSize, generations, seed) => {
      const random = replicateStream(seed, 2)
      const draw = (count: number): number => (random.next() >>> 0) % count
      let size = firstSize
      let full = founderKinship(size)
      let pedigree = founderPedigree(size)
      if (meanPedigreeInbreeding(pedigree) !== fullInbreeding(full, size)) return false
      for (let generation = 0; generation < generations; generation++) {
        if (draw(3) === 0) {
          // A translocation: founders join (unrelated, non-inbred).
          const count = 1 + draw(3)
          const joined = new Float32Array((size + count) ** 2)
          for (let x = 0; x < size; x++) joined.set(full.subarray(x * size, (x + 1) * size), x * (size + count))
          for (let x = size; x < size + count; x++) joined[x * (size + count) + x] = 0.5
          full = joined
          pedigree = withFounders(pedigree, count)
          size += count
        }
        const next = 2 + draw(30)
        const immigrants = draw(2) === 0 ? 0 : 1 + draw(3)
        const parent = (): number => (immigrants > 0 && draw(6) === 0 ? size + draw(immigrants) : draw(size))
        const mothers = Int32Array.from({ length: next }, parent)
        const fathers = Int32Array.from({ length: next }, parent)
        // Every immigrant number in use, so that they are numbered 0…k−1 like the model's.
        for (let k = 0; k < immigrants; k++) mothers[k % next] = size + k
        const used = new Set([...mothers, ...fathers].filter(number => number >= size)).size
        if (used !== immigrants) continue
        full = offspringKinship(full, size, mothers, fathers)
        pedigree = offspringPedigree(pedigree, mothers, fathers, used)
        size = next
        if (!Object.is(meanPedigreeInbreeding(pedigree), fullInbreeding(full, size))) return false
        // The breeders' matrix holds only animals that had offspring.
        if (pedigree.parentCount > new Set([...mothers, ...fathers]).size) return false
      }
      return true
    }), { numRuns: 300 })
  })
})

describe('evaluateFitness', () => {
  it('is the product over loci of 1 − s (homozygous), 1 − h·s (heterozygous) and the adaptive factor', () => {
    // The definition (the function's doc comment), one locus at a time, against the byte-table
    // sums taken word by word across individuals; equal up to rounding (relative 1e-12 on
    // a few hundred terms).
    fc.assert(fc.property(fc.integer({ min: 1, max: 300 }), fc.integer({ min: 1, max: 30 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }), (loci, size, seed) => {
      const params: RescueParams = {
        recipient: { census: 2 }, source: { census: 2 }, generations: 1, markerLoci: 8, load: { loci, meanSelection: 0.02 },
        translocation: { migrantsPerEvent: 0, eventInterval: 1, events: 0 },
      }
      const architecture = genomeArchitecture(rescuePlan('test', params), sharedStream(seed))
      const population = allocatePopulation(size, architecture)
      const random = replicateStream(seed, 1)
      for (let i = 0; i < population.load.length; i++) population.load[i] = random.next() & random.next()
      for (let i = 0; i < population.adaptive.length; i++) population.adaptive[i] = random.next() & 1
      const selection = { s: 0.3, h: 0.25 }
      const fitness = evaluateFitness(population, architecture, selection)
      const words = architecture.loadWords
      for (let individual = 0; individual < size; individual++) {
        let expected = 1
        for (let locus = 0; locus < loci; locus++) {
          const bit = (haplotype: number): number => ((population.load[(2 * individual + haplotype) * words + (locus >> 5)] ?? 0) >>> (locus & 31)) & 1
          const copies = bit(0) + bit(1)
          const s = architecture.selection[locus] ?? 0
          expected *= copies === 2 ? 1 - s : copies === 1 ? 1 - (architecture.dominance[locus] ?? 0) * s : 1
        }
        const adaptive = (population.adaptive[2 * individual] ?? 0) + (population.adaptive[2 * individual + 1] ?? 0)
        expected *= adaptive === 2 ? 1.3 : adaptive === 1 ? 1.075 : 1
        const got = fitness[individual] ?? Number.NaN
        if (expected === 0 ? got !== 0 : Math.abs(got / expected - 1) > 1e-12) return false
      }
      return true
    }), { numRuns: 150 })
  })
})

describe('countAlleles', () => {
  it('equals a bit-by-bit count', () => {
    fc.assert(fc.property(
      // Up to 600 haplotypes: past the 15- and 255-haplotype flushes of the lane counters; up to
      // 9 words: groups of four words side by side in SIMD lanes, then the leftover words.
      fc.integer({ min: 1, max: 9 }), fc.integer({ min: 0, max: 600 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }),
      (words, haplotypes, seed) => {
        const random = replicateStream(seed, 0)
        const bits = Int32Array.from({ length: words * haplotypes }, () => random.next())
        const loci = 32 * words - (seed % 5)
        const counts = countAlleles(bits, words, haplotypes, loci)
        for (let locus = 0; locus < loci; locus++) {
          let expected = 0
          for (let h = 0; h < haplotypes; h++) expected += ((bits[h * words + (locus >> 5)] ?? 0) >>> (locus & 31)) & 1
          if (counts[locus] !== expected) return false
        }
        return counts.length === loci
      },
    ), { numRuns: 60 })
  })

  it('does not overflow a lane when every haplotype carries every bit', () => {
    for (const haplotypes of [15, 16, 255, 256, 1000]) {
      for (const words of [2, 5]) {
        const counts = countAlleles(new Int32Array(words * haplotypes).fill(-1), words, haplotypes, 32 * words)
        expect(counts.every(count => count === haplotypes)).toBe(true)
      }
    }
  })
})

describe('dominance–selection relation h = exp(−k·s)/2', () => {
  it('has the closed form k = ((2h̄)^(−1/β) − 1)/θ', () => {
    expect(dominanceRate(0.25, 0.1, 1)).toBeCloseTo(10, 12)
    expect(dominanceRate(0.5, 0.05, 0.3)).toBe(0)
    expect(dominanceFromSelection(0, 50)).toBe(0.5)
  })

  it('gives the requested mean dominance over gamma-distributed s (Monte Carlo)', () => {
    const random = replicateStream(1, 0)
    const rate = dominanceRate(0.2, 0.05, 0.3)
    const draws = 100_000
    let sum = 0
    let sumSquares = 0
    for (let i = 0; i < draws; i++) {
      const h = dominanceFromSelection(sampleGamma(random, 0.3, 0.05 / 0.3), rate)
      sum += h
      sumSquares += h * h
    }
    const mean = sum / draws
    const standardError = Math.sqrt((sumSquares / draws - mean * mean) / draws)
    expect(Math.abs(mean - 0.2)).toBeLessThanOrEqual(Z * standardError)
  })

  it('rejects h̄ outside (0, ½]', () => {
    expect(() => dominanceRate(0, 0.05, 0.3)).toThrow('dominanceRate: meanDominance must be in (0, 0.5], got 0')
    expect(() => dominanceRate(0.6, 0.05, 0.3)).toThrow(RangeError)
  })
})

describe('reproductiveWeightShape', () => {
  it('makes two offspring share a parent with probability 2/Ne (Monte Carlo over weights)', () => {
    const random = replicateStream(2, 0)
    const parents = 50
    for (const target of [40, 20, 8]) {
      const shape = reproductiveWeightShape(parents, target)
      const draws = 4000
      let sum = 0
      let sumSquares = 0
      for (let i = 0; i < draws; i++) {
        const weights = Array.from({ length: parents }, () => sampleGamma(random, shape))
        const total = weights.reduce((a, b) => a + b, 0)
        const same = weights.reduce((a, w) => a + (w / total) ** 2, 0)
        sum += same
        sumSquares += same * same
      }
      const mean = sum / draws
      const standardError = Math.sqrt((sumSquares / draws - mean * mean) / draws)
      expect(Math.abs(mean - 2 / target)).toBeLessThanOrEqual(Z * standardError)
    }
  })

  it('needs no extra variance when Ne ≥ 2n', () => {
    expect(reproductiveWeightShape(50, 100)).toBe(Infinity)
    expect(reproductiveWeightShape(50, 1)).toBe(1e-3)
  })
})

describe('genome helpers', () => {
  it('equilibriumFrequency solves u = q·s·(h + (1 − 2h)·q)', () => {
    expect(equilibriumFrequency(1e-4, 0.1, 0.5)).toBeCloseTo(0.002, 15)
    expect(equilibriumFrequency(1e-4, 1, 0)).toBeCloseTo(0.01, 15)
    const q = equilibriumFrequency(2.5e-4, 0.2, 0.1)
    expect(q * 0.2 * (0.1 + 0.8 * q)).toBeCloseTo(2.5e-4, 15)
    expect(equilibriumFrequency(1e-3, 1e-6, 0.5)).toBe(0.5)
    expect(equilibriumFrequency(0, 0.1, 0.2)).toBe(0)
  })

  it('byteSums adds the values of the set bits of every byte', () => {
    const values = Float64Array.from({ length: 40 }, (_, i) => i + 0.5)
    const table = byteSums(values)
    expect(table.length).toBe(8 * 256)
    expect(table[0]).toBe(0)
    expect(table[0b101]).toBe(0.5 + 2.5)
    expect(table[4 * 256 + 0b11]).toBe(32.5 + 33.5)
    expect(table[4 * 256 + 255]).toBe(288) // loci 32…39: 32.5 + 33.5 + … + 39.5
    expect(table[5 * 256 + 255]).toBe(0) // loci 40…47 do not exist
  })

  it('setBitRange sets exactly the requested bits', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 100 }), (a, b) => {
      const [from, to] = a <= b ? [a, b] : [b, a]
      const bits = new Int32Array(4)
      setBitRange(bits, from, to)
      for (let i = 0; i < 128; i++) {
        const set = (((bits[i >> 5] ?? 0) >>> (i & 31)) & 1) === 1
        if (set !== (i >= from && i < to)) return false
      }
      return true
    }))
  })

  it('linkageLayout spreads loci evenly over chromosomes', () => {
    const layout = linkageLayout(6, 2, 1)
    expect(Array.from(layout.chromosomeStart)).toEqual([0, 3, 6])
    expect(Array.from(layout.position)).toEqual([1 / 6, 0.5, 5 / 6, 1 / 6, 0.5, 5 / 6])
  })
})

describe('writeGamete', () => {
  /** Fraction of gametes in which adjacent markers i, i+1 come from different parental haplotypes. */
  function recombinationFractions(params: RescueParams, gametes: number): number[] {
    const plan = rescuePlan('test', params)
    const architecture = genomeArchitecture(plan, sharedStream(1))
    const parent = allocatePopulation(1, architecture)
    // Haplotype 0 carries no derived allele, haplotype 1 carries all of them.
    parent.markers.fill(-1, architecture.markerWords, 2 * architecture.markerWords)
    const children = allocatePopulation(gametes, architecture)
    const random = replicateStream(9, 0)
    const scratch = gameteScratch(architecture)
    for (let g = 0; g < gametes; g++) writeGamete(parent, 0, children, g, 0, architecture, random, scratch)
    const fractions: number[] = []
    for (let locus = 0; locus + 1 < architecture.markerLoci; locus++) {
      let recombinant = 0
      for (let g = 0; g < gametes; g++) {
        const offset = 2 * g * architecture.markerWords
        const here = ((children.markers[offset + (locus >> 5)] ?? 0) >>> (locus & 31)) & 1
        const next = ((children.markers[offset + ((locus + 1) >> 5)] ?? 0) >>> ((locus + 1) & 31)) & 1
        if (here !== next) recombinant++
      }
      fractions.push(recombinant / gametes)
    }
    return fractions
  }
  const base: RescueParams = {
    recipient: { census: 2 }, source: { census: 2 }, generations: 1, markerLoci: 8, load: null,
    translocation: { migrantsPerEvent: 0, eventInterval: 1, events: 0 },
  }
  const gametes = 20_000
  const tolerance = (r: number): number => Z * Math.sqrt(r * (1 - r) / gametes)

  it('recombines unlinked loci with probability ½', () => {
    for (const fraction of recombinationFractions(base, gametes)) expect(Math.abs(fraction - 0.5)).toBeLessThanOrEqual(tolerance(0.5))
  })

  it('follows Haldane\'s map function r = ½(1 − e^(−2d)) on a map, and ½ between chromosomes', () => {
    // 8 markers on 2 chromosomes of 1 Morgan: 4 per chromosome, 0.25 M apart.
    const fractions = recombinationFractions({ ...base, map: { chromosomes: 2, chromosomeLength: 1 } }, gametes)
    const haldane = 0.5 * (1 - Math.exp(-2 * 0.25))
    fractions.forEach((fraction, locus) => {
      const expected = locus === 3 ? 0.5 : haldane
      expect(Math.abs(fraction - expected)).toBeLessThanOrEqual(tolerance(expected))
    })
  })

  it('adds Poisson(U) new harmful mutations per gamete', () => {
    const plan = rescuePlan('test', { ...base, load: { loci: 5000, mutationRate: 0.8 } })
    const architecture = genomeArchitecture(plan, sharedStream(1))
    const parent = allocatePopulation(1, architecture)
    const children = allocatePopulation(10_000, architecture)
    const random = replicateStream(10, 0)
    const scratch = gameteScratch(architecture)
    for (let g = 0; g < children.size; g++) writeGamete(parent, 0, children, g, 0, architecture, random, scratch)
    let mutations = 0
    for (const word of children.load) {
      let value = word
      while (value !== 0) {
        value &= value - 1
        mutations++
      }
    }
    // A second hit on the same locus of a gamete is lost: expected loss U²/(2·loci) ≈ 6·10⁻⁵.
    const mean = mutations / children.size
    expect(Math.abs(mean - 0.8)).toBeLessThanOrEqual(Z * Math.sqrt(0.8 / children.size))
  })
})
