import { kinshipOf, offspringKinship } from './kinship'

/**
 * Computes a generation's kinship from its parents' (`offspringKinship` or the kinship kernel's
 * method of the same name, which gives the same values).
 */
export type KinshipWriter = (parentKinship: Float32Array, parentCount: number, mothers: Int32Array, fathers: Int32Array) => Float32Array

/**
 * What pedigree kinship needs of one generation: the kinship among the
 * animals that were its parents, and each individual's mother and father.
 *
 * Only animals that had offspring appear in `parentKinship` (with a
 * Wright–Fisher family-size distribution about one adult in seven has none
 * when N offspring come from N/2 mothers): the matrix of a generation is
 * built when it breeds, among its actual parents, instead of among all its
 * individuals when it is born. Each entry is the same number either way.
 *
 * Parent numbers below `parentCount` index `parentKinship`. Numbers from
 * `parentCount` on stand for founders — animals of the phase's first
 * generation and translocated or immigrant animals — unrelated to everyone
 * and non-inbred; the founder at place x of its generation has the numbers
 * parentCount + 2x and parentCount + 2x + 1 (its own, so that it is related
 * to nobody but itself).
 */
export interface Pedigree {
  /** Kinship among the parents, parentCount × parentCount, row-major (single precision). */
  parentKinship: Float32Array
  parentCount: number
  /** Parent number of each individual's mother. */
  mothers: Int32Array
  /** Parent number of each individual's father. */
  fathers: Int32Array
}

/**
 * The pedigree of a generation of unrelated, non-inbred founders (the base
 * of pedigree F at the start of the phase).
 *
 * @param size - individuals
 * @returns a pedigree with no parents and founder numbers 2x, 2x + 1
 * @example meanPedigreeInbreeding(founderPedigree(3)) // 0
 */
export function founderPedigree(size: number): Pedigree {
  return {
    parentKinship: new Float32Array(0),
    parentCount: 0,
    mothers: Int32Array.from({ length: size }, (_, x) => 2 * x),
    fathers: Int32Array.from({ length: size }, (_, x) => 2 * x + 1),
  }
}

/**
 * The pedigree with `count` founders appended (translocated animals join the
 * generation at places size … size + count − 1).
 *
 * @param pedigree - the residents' pedigree (not modified)
 * @param count - founders to append, integer ≥ 0
 * @returns a new pedigree sharing the parents' kinship
 */
export function withFounders(pedigree: Pedigree, count: number): Pedigree {
  const size = pedigree.mothers.length
  const mothers = new Int32Array(size + count)
  const fathers = new Int32Array(size + count)
  mothers.set(pedigree.mothers)
  fathers.set(pedigree.fathers)
  for (let x = size; x < size + count; x++) {
    mothers[x] = pedigree.parentCount + 2 * x
    fathers[x] = pedigree.parentCount + 2 * x + 1
  }
  return { parentKinship: pedigree.parentKinship, parentCount: pedigree.parentCount, mothers, fathers }
}

/**
 * The offspring's pedigree: kinship among the animals that bred (by
 * `offspringKinship` from their own parents), and each offspring's mother
 * and father renumbered among them.
 *
 * @param pedigree - the breeding generation's pedigree
 * @param mothers - each offspring's mother: her place in the breeding
 *   generation, or size + k for the k-th immigrant (numbered in order of first use)
 * @param fathers - the same for fathers
 * @param immigrants - number of distinct immigrant parents
 * @param writeKinship - how the members' kinship is computed (`offspringKinship` by default; `reproduce` passes its lineage's kinship kernel)
 * @returns the offspring's pedigree
 */
export function offspringPedigree(pedigree: Pedigree, mothers: Int32Array, fathers: Int32Array, immigrants: number, writeKinship: KinshipWriter = offspringKinship): Pedigree {
  const size = pedigree.mothers.length
  // Residents who bred, in order of place, then the immigrants: every parent
  // is first marked 0 (−1: did not breed), then numbered in one pass in order.
  const member = new Int32Array(size + immigrants).fill(-1)
  for (let child = 0; child < mothers.length; child++) {
    member[mothers[child] as number] = 0 // parent numbers < size + immigrants by contract
    member[fathers[child] as number] = 0
  }
  let members = 0
  for (let number = 0; number < size; number++) {
    if (member[number] === 0) member[number] = members++
  }
  const resident = members
  for (let k = 0; k < immigrants; k++) member[size + k] = members++
  const memberMothers = new Int32Array(members)
  const memberFathers = new Int32Array(members)
  for (let number = 0; number < size; number++) {
    const index = member[number] as number
    if (index < 0) continue
    memberMothers[index] = pedigree.mothers[number] as number
    memberFathers[index] = pedigree.fathers[number] as number
  }
  // Immigrants are founders, at places size + k of the breeding generation.
  for (let k = 0; k < immigrants; k++) {
    memberMothers[resident + k] = pedigree.parentCount + 2 * (size + k)
    memberFathers[resident + k] = pedigree.parentCount + 2 * (size + k) + 1
  }
  const offspringMothers = new Int32Array(mothers.length)
  const offspringFathers = new Int32Array(fathers.length)
  for (let child = 0; child < mothers.length; child++) {
    offspringMothers[child] = member[mothers[child] as number] as number
    offspringFathers[child] = member[fathers[child] as number] as number
  }
  return {
    parentKinship: writeKinship(pedigree.parentKinship, pedigree.parentCount, memberMothers, memberFathers),
    parentCount: members,
    mothers: offspringMothers,
    fathers: offspringFathers,
  }
}

/**
 * Mean pedigree inbreeding F of a generation: F_x is the kinship of x's
 * parents, read through the self-kinship ½(1 + F_x) stored in single
 * precision, as the full offspring matrix would hold it.
 *
 * @param pedigree - the generation's pedigree
 * @returns mean F (NaN for an empty generation)
 */
export function meanPedigreeInbreeding(pedigree: Pedigree): number {
  const { parentKinship, parentCount, mothers, fathers } = pedigree
  const size = mothers.length
  let sum = 0
  for (let x = 0; x < size; x++) {
    const selfKinship = Math.fround(0.5 * (1 + kinshipOf(parentKinship, parentCount, mothers[x] as number, fathers[x] as number)))
    sum += 2 * selfKinship - 1
  }
  return sum / size
}
