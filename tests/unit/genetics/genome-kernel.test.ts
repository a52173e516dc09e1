/**
 * The genome kernel (kernels/genome.ts) must write the gametes `writeGamete`'s TypeScript loops
 * write, drawing the same numbers: `reproduce` is run twice from the same parents and stream
 * state, once with a pure-rand generator (TypeScript loops, the reference) and once with a
 * WordStream (kernel), and everything must agree bit for bit — offspring haplotypes, adaptive
 * alleles, parents, pedigree kinship and where each stream ends. Without continuing migration the
 * kernel runs the whole generation (parent draws, gametes, new mutations, adaptive alleles); with
 * it, the TypeScript loop calls the kernel for each gamete's words.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus'
import { genomeArchitecture } from '../../../shared/genetics/simulate/rescue/architecture'
import { rescuePlan } from '../../../shared/genetics/simulate/rescue/rescue-plan'
import { assignAdaptiveAlleles, foundingPopulation } from '../../../shared/genetics/simulate/rescue/founders'
import { founderPedigree } from '../../../shared/genetics/simulate/rescue/pedigree'
import { gameteScratch } from '../../../shared/genetics/simulate/rescue/gamete'
import { evaluateFitness } from '../../../shared/genetics/simulate/rescue/evaluate'
import { reproduce, reproductionScratch } from '../../../shared/genetics/simulate/rescue/reproduce'
import type { Population } from '../../../shared/genetics/simulate/rescue/population'
import { replicateStream, sharedStream } from '../../../shared/genetics/simulate/random'
import { WordStream } from '../../../shared/genetics/simulate/random/word-stream'
import type { RescueParams } from '../../../shared/genetics/simulate/rescue'

const snapshot = (population: Population | null) => population && {
  markers: Array.from(population.markers), load: Array.from(population.load), adaptive: Array.from(population.adaptive),
  kinship: population.pedigree ? Array.from(population.pedigree.parentKinship) : null,
  mothers: population.pedigree ? Array.from(population.pedigree.mothers) : null,
  fathers: population.pedigree ? Array.from(population.pedigree.fathers) : null,
}

describe('genome kernel gametes', () => {
  it('reproduce gives the same offspring and stream position with the kernel as with the TypeScript loops', () => {
    fc.assert(fc.property(
      fc.integer({ min: 4, max: 60 }), fc.integer({ min: 1, max: 300 }), fc.integer({ min: 1, max: 100 }),
      // m = 0 runs the whole generation in the kernel; m > 0 the TypeScript loop with kernel gametes.
      fc.oneof(fc.constant(0), fc.double({ min: 0, max: 0.3, noNaN: true })), fc.integer({ min: 1, max: 1000 }),
      fc.constantFrom(0, 0.4, 3, 12), fc.constantFrom(0.7, 1),
      (size, loadLoci, markerLoci, migrationRate, seed, mutationRate, effectiveRatio) => {
        const params: RescueParams = {
          recipient: { census: size }, source: { census: size + 3 }, generations: 3, markerLoci,
          load: { loci: loadLoci, mutationRate }, adaptive: { s: 0.1, h: 0.5, sourceFrequency: 0.5 },
          translocation: { migrantsPerEvent: 1, eventInterval: 1, events: 1, migrationRate },
        }
        const architecture = genomeArchitecture(rescuePlan('test', params), sharedStream(seed))
        const founders = replicateStream(seed, 0)
        const parents = foundingPopulation(size, architecture, founders)
        assignAdaptiveAlleles(parents, 0.5, founders)
        parents.pedigree = founderPedigree(size)
        const source = foundingPopulation(size + 3, architecture, founders)
        const fitness = evaluateFitness(parents, architecture, null)
        const immigrants = migrationRate > 0 ? { source, rate: migrationRate } : null
        const state = replicateStream(seed, 1).getState()

        const reference = xoroshiro128plusFromState(state)
        const expected = reproduce(parents, fitness, size + 1, effectiveRatio, architecture, immigrants, reference, reproductionScratch(gameteScratch(architecture)))
        const stream = new WordStream(state)
        const actual = reproduce(parents, fitness, size + 1, effectiveRatio, architecture, immigrants, stream, reproductionScratch(gameteScratch(architecture)))

        expect(snapshot(actual)).toEqual(snapshot(expected))
        expect(stream.getState()).toEqual(reference.getState())
      },
    ), { numRuns: 60 })
  })
})

describe('genome kernel founders', () => {
  it('foundingPopulation places the same harmful copies, drawing the same numbers, with the kernel as without', () => {
    fc.assert(fc.property(fc.integer({ min: 2, max: 80 }), fc.integer({ min: 1, max: 400 }), fc.integer({ min: 1, max: 1000 }), (size, loadLoci, seed) => {
      const params: RescueParams = {
        recipient: { census: size }, source: { census: size }, generations: 1, markerLoci: 40,
        load: { loci: loadLoci, meanSelection: 0.02 }, translocation: { migrantsPerEvent: 1, eventInterval: 1, events: 1 },
      }
      const architecture = genomeArchitecture(rescuePlan('test', params), sharedStream(seed))
      const state = replicateStream(seed, 2).getState()
      const reference = xoroshiro128plusFromState(state)
      const stream = new WordStream(state)
      const expected = foundingPopulation(size, architecture, reference)
      const actual = foundingPopulation(size, architecture, stream)
      expect(Array.from(actual.load)).toEqual(Array.from(expected.load))
      expect(Array.from(actual.markers)).toEqual(Array.from(expected.markers))
      expect(stream.getState()).toEqual(reference.getState())
    }), { numRuns: 40 })
  })
})

describe('genome kernel lineages', () => {
  it('gives the TypeScript loops\' generations over a lineage whose size changes, each valid until the generation after next', () => {
    fc.assert(fc.property(
      fc.integer({ min: 4, max: 40 }), fc.array(fc.integer({ min: 2, max: 120 }), { minLength: 2, maxLength: 6 }),
      fc.array(fc.boolean(), { minLength: 6, maxLength: 6 }), fc.integer({ min: 1, max: 1000 }),
      (size, sizes, migrating, seed) => {
        const params: RescueParams = {
          recipient: { census: size }, source: { census: size }, generations: 3, markerLoci: 70,
          load: { loci: 150, mutationRate: 0.5 }, adaptive: { s: 0.1, h: 0.5, sourceFrequency: 0.5 },
          translocation: { migrantsPerEvent: 1, eventInterval: 1, events: 1, migrationRate: 0.1 },
        }
        const architecture = genomeArchitecture(rescuePlan('test', params), sharedStream(seed))
        const founders = replicateStream(seed, 0)
        const start = foundingPopulation(size, architecture, founders)
        assignAdaptiveAlleles(start, 0.5, founders)
        start.pedigree = founderPedigree(size)
        const source = foundingPopulation(size, architecture, founders)
        const state = replicateStream(seed, 1).getState()
        const reference = xoroshiro128plusFromState(state)
        const stream = new WordStream(state)
        const referenceScratch = reproductionScratch(gameteScratch(architecture))
        const kernelScratch = reproductionScratch(gameteScratch(architecture))
        let expected: Population | null = start
        let actual: Population | null = start
        let previous: { population: Population, snapshot: ReturnType<typeof snapshot> } | null = null
        for (const [generation, next] of sizes.entries()) {
          if (!expected || !actual) break
          const immigrants = migrating[generation] ? { source, rate: 0.1 } : null
          expected = reproduce(expected, evaluateFitness(expected, architecture, null), next, 0.8, architecture, immigrants, reference, referenceScratch)
          actual = reproduce(actual, evaluateFitness(actual, architecture, null), next, 0.8, architecture, immigrants, stream, kernelScratch)
          expect(snapshot(actual)).toEqual(snapshot(expected))
          if (previous) expect(snapshot(previous.population)).toEqual(previous.snapshot)
          previous = actual ? { population: actual, snapshot: snapshot(actual) } : null
        }
        expect(stream.getState()).toEqual(reference.getState())
      },
    ), { numRuns: 40 })
  })
})
