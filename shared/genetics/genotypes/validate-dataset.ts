import { domainError } from '../validate'
import type { GenotypeDataset } from './types'

/** One problem found in a dataset, with the individual and locus it concerns when known. */
export interface GenotypeDatasetProblem {
  individual?: string
  locus?: string
  message: string
}

/** Outcome of `validateGenotypeDataset`. */
export type GenotypeDatasetValidation = { ok: true } | { ok: false, problems: GenotypeDatasetProblem[] }

/** At most this many problems are listed; one more entry then says how many were left out. */
export const MAX_LISTED_PROBLEMS = 100

function describe(value: unknown): string {
  if (value === null) return 'null'
  if (value === undefined) return 'nothing'
  if (Array.isArray(value)) return `a list of ${value.length}`
  if (typeof value === 'string') return `"${value}"`
  return `${typeof value} ${String(value)}`
}

class ProblemList {
  readonly problems: GenotypeDatasetProblem[] = []
  total = 0
  add(problem: GenotypeDatasetProblem): void {
    this.total += 1
    if (this.problems.length < MAX_LISTED_PROBLEMS) this.problems.push(problem)
  }
}

function checkLoci(loci: unknown, list: ProblemList): string[] {
  if (!Array.isArray(loci)) {
    list.add({ message: `the dataset needs "loci", a list of locus names, got ${describe(loci)}` })
    return []
  }
  if (loci.length === 0) list.add({ message: 'the dataset has no loci' })
  const names: string[] = []
  const seen = new Set<string>()
  loci.forEach((locus: unknown, index) => {
    const label = typeof locus === 'string' ? locus : `#${index + 1}`
    names.push(label)
    if (typeof locus !== 'string' || locus.trim() === '') {
      list.add({ message: `locus number ${index + 1} has no name (got ${describe(locus)})` })
    } else if (seen.has(locus)) {
      list.add({ locus, message: `locus "${locus}" appears more than once in the list of loci` })
    }
    seen.add(label)
  })
  return names
}

function checkAllele(allele: unknown, where: string, list: ProblemList, individual: string, locus: string): void {
  if (typeof allele !== 'string') {
    list.add({ individual, locus, message: `${where} has allele ${describe(allele)}; alleles must be text such as "101"` })
  } else if (allele === '') {
    list.add({ individual, locus, message: `${where} has an empty allele ""; use null for a missing genotype` })
  } else if (allele.trim() !== allele) {
    list.add({ individual, locus, message: `${where} has allele "${allele}" with spaces around it` })
  }
}

function checkGenotype(genotype: unknown, individual: string, locus: string, list: ProblemList): void {
  if (genotype === null) return
  const where = `individual "${individual}" at locus "${locus}"`
  if (!Array.isArray(genotype)) {
    list.add({ individual, locus, message: `${where} has genotype ${describe(genotype)}; expected two alleles or null` })
    return
  }
  if (genotype.length !== 2) {
    list.add({ individual, locus, message: `${where} has ${genotype.length} allele(s); only diploid genotypes (ploidy 2) are supported` })
    return
  }
  for (const allele of genotype) checkAllele(allele, where, list, individual, locus)
}

function checkIndividual(value: unknown, index: number, loci: string[], seenIds: Map<string, number>, list: ProblemList): void {
  const record = (typeof value === 'object' && value !== null ? value : {}) as { id?: unknown, genotypes?: unknown }
  const id = typeof record.id === 'string' && record.id.trim() !== '' ? record.id : undefined
  const label = id ?? `number ${index + 1}`
  if (id === undefined) list.add({ message: `individual number ${index + 1} has no id (got ${describe(record.id)})` })
  else if (seenIds.has(id)) list.add({ individual: id, message: `individual "${id}" appears more than once (numbers ${(seenIds.get(id) ?? 0) + 1} and ${index + 1})` })
  else seenIds.set(id, index)
  const genotypes = record.genotypes
  if (!Array.isArray(genotypes)) {
    list.add({ ...(id && { individual: id }), message: `individual ${id ? `"${id}"` : label} needs "genotypes", a list with one entry per locus, got ${describe(genotypes)}` })
    return
  }
  if (genotypes.length !== loci.length) {
    list.add({ ...(id && { individual: id }), message: `individual ${id ? `"${id}"` : label} has ${genotypes.length} genotypes but the dataset has ${loci.length} loci` })
  }
  const shown = id ?? label
  genotypes.forEach((genotype: unknown, locusIndex) => {
    checkGenotype(genotype, shown, loci[locusIndex] ?? `#${locusIndex + 1}`, list)
  })
}

/**
 * Checks that a dataset has the shape every genotype summary relies on, and
 * lists each problem in plain words with the individual and locus concerned.
 *
 * Why: uploaded data reaches the engine from the browser preview and the
 * server; the server answers 422 with these messages so the user can find
 * the offending row and column.
 *
 * Rules: at least one locus and one individual; locus names non-empty and
 * unique; individual ids non-empty and unique; each individual has exactly
 * one entry per locus; each entry is `null` (missing) or two alleles
 * (ploidy 2); each allele is non-empty text without surrounding spaces.
 * At most `MAX_LISTED_PROBLEMS` problems are listed, then one summary entry.
 * Any value is accepted (e.g. parsed JSON); nothing is thrown.
 *
 * @param dataset - candidate `GenotypeDataset`, any value
 * @returns `{ ok: true }`, or `{ ok: false, problems }` with one entry per problem
 * @example validateGenotypeDataset({ loci: ['Loc1'], individuals: [{ id: 'AH1', genotypes: [['101', '103']] }] })
 *   // { ok: true }
 * @example validateGenotypeDataset({ loci: ['Loc1'], individuals: [{ id: 'AH1', genotypes: [['101', '']] }] })
 *   // { ok: false, problems: [{ individual: 'AH1', locus: 'Loc1',
 *   //   message: 'individual "AH1" at locus "Loc1" has an empty allele ""; use null for a missing genotype' }] }
 * @example validateGenotypeDataset({ loci: ['Loc1', 'Loc2'], individuals: [{ id: 'AH1', genotypes: [null] }] })
 *   // problems: [{ individual: 'AH1', message: 'individual "AH1" has 1 genotypes but the dataset has 2 loci' }]
 */
export function validateGenotypeDataset(dataset: unknown): GenotypeDatasetValidation {
  const list = new ProblemList()
  if (typeof dataset !== 'object' || dataset === null || Array.isArray(dataset)) {
    return { ok: false, problems: [{ message: `the dataset must be an object with "loci" and "individuals", got ${describe(dataset)}` }] }
  }
  const { loci, individuals } = dataset as { loci?: unknown, individuals?: unknown }
  const locusNames = checkLoci(loci, list)
  if (!Array.isArray(individuals)) {
    list.add({ message: `the dataset needs "individuals", a list, got ${describe(individuals)}` })
  } else {
    if (individuals.length === 0) list.add({ message: 'the dataset has no individuals' })
    const seenIds = new Map<string, number>()
    individuals.forEach((individual: unknown, index) => checkIndividual(individual, index, locusNames, seenIds, list))
  }
  if (list.total === 0) return { ok: true }
  const problems = list.problems
  if (list.total > problems.length) {
    problems.push({ message: `${list.total - problems.length} more problems not listed` })
  }
  return { ok: false, problems }
}

/**
 * Engine guard: throws the standard RangeError naming the first problem when
 * `dataset` is not a valid `GenotypeDataset`.
 */
export function requireValidGenotypeDataset(fn: string, parameter: string, dataset: GenotypeDataset): void {
  const result = validateGenotypeDataset(dataset)
  if (result.ok) return
  const [first] = result.problems
  const more = result.problems.length > 1 ? ' (and further problems)' : ''
  domainError(fn, parameter, 'a valid genotype dataset', `${first?.message ?? 'unknown problem'}${more}`)
}
