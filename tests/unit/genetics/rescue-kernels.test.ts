/**
 * The rescue model's fitness and kinship kernels (kernels/fitness.ts, kernels/kinship.ts) must
 * give the values of the TypeScript they replaced, bit for bit: the references here are the
 * TypeScript log-fitness loop as it stood before the kernel (transcribed below) and
 * `offspringKinship` in shared/genetics/simulate/rescue/kinship.ts. The rescue digests in
 * engine-reproducibility.test.ts then pin the whole model.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { genomeArchitecture } from '../../../shared/genetics/simulate/rescue/architecture'
import { rescuePlan } from '../../../shared/genetics/simulate/rescue/rescue-plan'
import { offspringKinship } from '../../../shared/genetics/simulate/rescue/kinship'
import { FitnessKernel } from '../../../shared/genetics/simulate/kernels/fitness-kernel'
import { KinshipKernel } from '../../../shared/genetics/simulate/kernels/kinship-kernel'
import { replicateStream, sharedStream } from '../../../shared/genetics/simulate/random'
import type { RescueParams } from '../../../shared/genetics/simulate/rescue'

/** The TypeScript log-fitness sums as evaluateFitness computed them before the kernel. */
function referenceLogFitness(load: Int32Array, size: number, words: number, homTable: Float64Array, hetTable: Float64Array): Float64Array {
  const sums = new Float64Array(size)
  for (let word = 0; word < words; word++) {
    const table = word << 10
    for (let individual = 0, first = word; individual < size; individual++, first += 2 * words) {
      const a = load[first] as number
      const b = load[first + words] as number
      const homozygous = a & b
      const heterozygous = a ^ b
      let sum = sums[individual] as number
      sum += (homTable[table + (homozygous & 255)] as number) + (homTable[table + 256 + ((homozygous >>> 8) & 255)] as number)
        + (homTable[table + 512 + ((homozygous >>> 16) & 255)] as number) + (homTable[table + 768 + (homozygous >>> 24)] as number)
      sum += (hetTable[table + (heterozygous & 255)] as number) + (hetTable[table + 256 + ((heterozygous >>> 8) & 255)] as number)
        + (hetTable[table + 512 + ((heterozygous >>> 16) & 255)] as number) + (hetTable[table + 768 + (heterozygous >>> 24)] as number)
      sums[individual] = sum
    }
  }
  return sums
}

const sameBits = (actual: ArrayLike<number>, expected: ArrayLike<number>): boolean =>
  actual.length === expected.length && Array.from(actual).every((value, i) => Object.is(value, expected[i]))

describe('fitness kernel', () => {
  it('sums log fitness exactly as the TypeScript loop did, for populations of any size in turn', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 700 }), fc.array(fc.integer({ min: 1, max: 120 }), { minLength: 1, maxLength: 4 }), fc.integer(), (loci, sizes, seed) => {
      const params: RescueParams = {
        recipient: { census: 2 }, source: { census: 2 }, generations: 1, markerLoci: 8, load: { loci, meanSelection: 0.3 },
        translocation: { migrantsPerEvent: 0, eventInterval: 1, events: 0 },
      }
      const architecture = genomeArchitecture(rescuePlan('test', params), sharedStream(seed))
      const kernel = new FitnessKernel(architecture.loadWords, architecture.byteLogHomozygous, architecture.byteLogHeterozygous)
      const random = replicateStream(seed, 2)
      for (const size of sizes) {
        const load = Int32Array.from({ length: 2 * size * architecture.loadWords }, () => random.next() & random.next() & random.next())
        const expected = referenceLogFitness(load, size, architecture.loadWords, architecture.byteLogHomozygous, architecture.byteLogHeterozygous)
        if (!sameBits(kernel.logFitness(load, size), expected)) return false
      }
      return true
    }), { numRuns: 60 })
  })
})

describe('kinship kernel', () => {
  /** A random symmetric parents' matrix with ½(1 + F) on the diagonal, as float32. */
  function parentsMatrix(count: number, seed: number): Float32Array {
    const random = replicateStream(seed, 3)
    const matrix = new Float32Array(count * count)
    for (let a = 0; a < count; a++) {
      matrix[a * count + a] = 0.5 + (random.next() >>> 0) / 2 ** 34
      for (let b = a + 1; b < count; b++) matrix[a * count + b] = matrix[b * count + a] = (random.next() >>> 0) / 2 ** 35
    }
    return matrix
  }

  it('gives offspringKinship\'s matrix bit for bit over generations, with founders among the parents or not', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 90 }), fc.array(fc.tuple(fc.integer({ min: 1, max: 120 }), fc.integer({ min: 0, max: 6 })), { minLength: 1, maxLength: 5 }), fc.integer(), (founders, generations, seed) => {
      const random = replicateStream(seed, 4)
      const kernel = new KinshipKernel()
      let reference = parentsMatrix(founders, seed)
      let kernelMatrix: Float32Array = reference
      let parentCount = founders
      for (const [size, newFounders] of generations) {
        // Parents are numbered 0 … parentCount − 1; founders (immigrants) above.
        const pick = (): number => (parentCount > 0 && random.next() >>> 0 < 0.9 * 2 ** 32) || newFounders === 0
          ? Math.max(0, (random.next() >>> 0) % Math.max(1, parentCount))
          : parentCount + ((random.next() >>> 0) % (2 * newFounders))
        const mothers = Int32Array.from({ length: size }, pick)
        const fathers = Int32Array.from({ length: size }, pick)
        const previousKernelMatrix = kernelMatrix
        reference = offspringKinship(reference, parentCount, mothers, fathers)
        kernelMatrix = kernel.offspringKinship(previousKernelMatrix, parentCount, mothers, fathers)
        if (!sameBits(kernelMatrix, reference)) return false
        parentCount = size
      }
      return true
    }), { numRuns: 80 })
  })

  it('keeps the previous generation\'s matrix intact while writing the next, also when it needs a larger memory', () => {
    const kernel = new KinshipKernel()
    const founders = Int32Array.from({ length: 4 }, (_, x) => 2 * x)
    const first = kernel.offspringKinship(new Float32Array(0), 0, founders, Int32Array.from(founders, value => value + 1))
    const firstCopy = Float32Array.from(first)
    const second = kernel.offspringKinship(first, 4, Int32Array.of(0, 0, 1), Int32Array.of(2, 3, 3))
    expect(sameBits(first, firstCopy)).toBe(true)
    const big = 300
    const third = kernel.offspringKinship(second, 3, Int32Array.from({ length: big }, (_, x) => x % 3), Int32Array.from({ length: big }, (_, x) => (x + 1) % 3))
    expect(sameBits(third, offspringKinship(Float32Array.from(second), 3, Int32Array.from({ length: big }, (_, x) => x % 3), Int32Array.from({ length: big }, (_, x) => (x + 1) % 3)))).toBe(true)
    expect(second.length).toBe(9) // still readable after the kernel moved to a larger memory
  })
})
