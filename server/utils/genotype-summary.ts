/**
 * Genotype files → the engine's dataset → the summary stored in `genetic_datasets.summary`.
 * Pure (no database, storage or Nitro globals), so the demo seed (seeds/0002-demo-genotypes.ts)
 * computes exactly what the upload route computes. Imports the engine through its barrel by
 * relative path, because the seed runs under plain tsx where the `#shared` alias is unknown.
 *
 * What is stored (`StoredGenotypeSummary`):
 * - `diversity`: `summarizeGenotypes` (per locus and multi-locus Ho, Nei 1978 He, F_IS;
 *   monomorphic loci included in the means);
 * - `smallestGeneCount`: the fewest gene copies at any locus (largest rarefaction size);
 * - `comparison`: what depends on the other subpopulations of the species, recomputed whenever
 *   a dataset of the species is added or deleted (`compareSpeciesGenotypes`):
 *   allelic richness rarefied to the smallest sample of the comparison set, and private alleles.
 *
 * The comparison set of a dataset: the dataset itself plus the *current* dataset (latest sampled
 * year, then latest upload) of the same marker type of every *other* subpopulation of the
 * species that has at least one locus (by name) in common with it — a panel of other loci
 * cannot be compared, and would leave no shared locus for private alleles. Rarefaction size g = the smallest per-locus gene count over that set (SCIENCE.md
 * §8.1 asks for the smallest sample among the populations compared), so the current datasets
 * of all subpopulations are rarefied to the same g and can be compared directly.
 */
import {
  allelicRichness,
  parseGenotypeCsv,
  parseVcf,
  privateAlleles,
  smallestGeneCount,
  summarizeGenotypes,
  validateGenotypeDataset,
  type AllelicRichnessResult,
  type GenotypeDataset,
  type GenotypeSummary,
} from '../../shared/genetics/index'
import type { GeneticDatasetFormat, MarkerType } from '../../shared/types/db'

/** Version of the stored JSON shape; bump when it changes (rows of an older version then need recomputing from their files). */
export const GENOTYPE_SUMMARY_SCHEMA_VERSION = 1

/** Storage keys of the demo datasets start with this; their files are committed in DEMO_GENOTYPE_FOLDER. */
export const DEMO_GENOTYPE_KEY_PREFIX = 'seed/demo-genotypes/'
/** Folder of the committed demo genotype files, relative to the project root. */
export const DEMO_GENOTYPE_FOLDER = 'seeds/demo/genotypes'

/** At most this many private alleles are listed per dataset (the count stays exact). */
export const MAX_LISTED_PRIVATE_ALLELES = 500

/** A problem with an uploaded file, located where possible. */
export interface GenotypeFileIssue {
  path: 'file'
  message: string
  line?: number
  locus?: string
  individual?: string
}

export type GenotypeReadResult
  = | { ok: true, dataset: GenotypeDataset }
    | { ok: false, message: string, issues: GenotypeFileIssue[] }

/** Richness of one dataset within its comparison set. */
export type StoredRichness
  = | { available: true, rarefactionSize: number, limitedBy: { subpopulationName: string, locus: string }, result: AllelicRichnessResult }
    | { available: false, reason: string }

/** Private alleles of one dataset within its comparison set. */
export type StoredPrivateAlleles
  = | { available: true, count: number, alleles: { locus: string, allele: string }[], truncated: boolean, sharedLoci: number, skippedLoci: string[], comparedWith: string[] }
    | { available: false, reason: string }

/** What depends on the other subpopulations of the species. */
export interface StoredComparison {
  current: boolean
  comparedWith: { datasetId: number, subpopulationId: number, subpopulationName: string }[]
  /** subpopulations with a dataset of the same marker type but no locus in common (not compared) */
  withoutSharedLoci: string[]
  richness: StoredRichness
  privateAlleles: StoredPrivateAlleles
}

/** The JSON in `genetic_datasets.summary`. */
export interface StoredGenotypeSummary {
  schemaVersion: number
  diversity: GenotypeSummary
  smallestGeneCount: { geneCount: number, locus: string }
  comparison: StoredComparison | null
}

/**
 * Decodes uploaded bytes as UTF-8 text (a byte-order mark is dropped by the parsers).
 *
 * @returns the text, or null when the bytes are not valid UTF-8
 */
export function decodeGenotypeText(bytes: Uint8Array): string | null {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes)
  } catch {
    return null
  }
}

function plural(count: number, one: string, many: string): string {
  return `${count} ${count === 1 ? one : many}`
}

/**
 * Parses a genotype file with the engine's reader for `format` and validates the dataset.
 * Problems come back with their line (parse errors) or individual and locus (validation), and
 * a one-line `message` naming the first of them.
 *
 * @example readGenotypeText('id,L_1,L_2\nA,1\n', 'csv')
 *   // { ok: false, message: 'Line 2: has 2 columns; the header has 3', issues: [{ path: 'file', line: 2, … }] }
 */
export function readGenotypeText(text: string, format: GeneticDatasetFormat): GenotypeReadResult {
  const parsed = format === 'vcf' ? parseVcf(text) : parseGenotypeCsv(text)
  if ('errors' in parsed) {
    const issues: GenotypeFileIssue[] = parsed.errors.map((error) => {
      const locus = /locus "([^"]+)"/.exec(error.message)?.[1]
      return { path: 'file', line: error.line, message: `Line ${error.line}: ${error.message}`, ...(locus ? { locus } : {}) }
    })
    const more = issues.length > 1 ? ` (and ${plural(issues.length - 1, 'more problem', 'more problems')})` : ''
    return { ok: false, message: `${issues[0]?.message ?? 'The file could not be read.'}${more}`, issues }
  }
  const validation = validateGenotypeDataset(parsed.dataset)
  if (!validation.ok) {
    const issues: GenotypeFileIssue[] = validation.problems.map(problem => ({
      path: 'file',
      message: problem.message,
      ...(problem.locus ? { locus: problem.locus } : {}),
      ...(problem.individual ? { individual: problem.individual } : {}),
    }))
    const more = issues.length > 1 ? ` (and ${plural(issues.length - 1, 'more problem', 'more problems')})` : ''
    return { ok: false, message: `${issues[0]?.message ?? 'The dataset is not valid.'}${more}`, issues }
  }
  return { ok: true, dataset: parsed.dataset }
}

/** The per-dataset part of the summary (no comparison yet). */
export function summarizeGenotypeDataset(dataset: GenotypeDataset): StoredGenotypeSummary {
  return {
    schemaVersion: GENOTYPE_SUMMARY_SCHEMA_VERSION,
    diversity: summarizeGenotypes(dataset),
    smallestGeneCount: smallestGeneCount(dataset),
    comparison: null,
  }
}

/** One dataset of a species, as the comparison needs it. */
export interface ComparisonEntry {
  datasetId: number
  subpopulationId: number
  subpopulationName: string
  markerType: MarkerType
  sampledYear: number | null
  createdAt: Date
  dataset: GenotypeDataset
  smallestGeneCount: { geneCount: number, locus: string }
}

/** Newer first: sampled year (unknown counts as oldest), then upload time, then id. */
function newerFirst(a: Pick<ComparisonEntry, 'sampledYear' | 'createdAt' | 'datasetId'>, b: Pick<ComparisonEntry, 'sampledYear' | 'createdAt' | 'datasetId'>): number {
  const yearA = a.sampledYear ?? -Infinity
  const yearB = b.sampledYear ?? -Infinity
  if (yearA !== yearB) return yearB - yearA
  const timeDifference = b.createdAt.getTime() - a.createdAt.getTime()
  if (timeDifference !== 0) return timeDifference
  return b.datasetId - a.datasetId
}

/**
 * The dataset each subpopulation contributes to species comparisons, per marker type: the
 * latest sampled year, then the latest upload, then the highest id.
 *
 * @returns ids of the current datasets
 */
export function currentDatasetIds(entries: readonly Pick<ComparisonEntry, 'datasetId' | 'subpopulationId' | 'markerType' | 'sampledYear' | 'createdAt'>[]): Set<number> {
  const best = new Map<string, (typeof entries)[number]>()
  for (const entry of entries) {
    const key = `${entry.subpopulationId}:${entry.markerType}`
    const held = best.get(key)
    if (!held || newerFirst(entry, held) < 0) best.set(key, entry)
  }
  return new Set([...best.values()].map(entry => entry.datasetId))
}

function richnessWithin(target: ComparisonEntry, set: readonly ComparisonEntry[]): StoredRichness {
  if (target.smallestGeneCount.geneCount < 1) {
    return { available: false, reason: `Locus "${target.smallestGeneCount.locus}" has no genotyped individual in this dataset, so richness cannot be rarefied.` }
  }
  let limit = target
  for (const entry of set) {
    if (entry.smallestGeneCount.geneCount >= 1 && entry.smallestGeneCount.geneCount < limit.smallestGeneCount.geneCount) limit = entry
  }
  const rarefactionSize = limit.smallestGeneCount.geneCount
  return {
    available: true,
    rarefactionSize,
    limitedBy: { subpopulationName: limit.subpopulationName, locus: limit.smallestGeneCount.locus },
    result: allelicRichness(target.dataset, rarefactionSize),
  }
}

function privateAllelesWithin(target: ComparisonEntry, others: readonly ComparisonEntry[]): StoredPrivateAlleles {
  if (others.length === 0) {
    return { available: false, reason: `No other subpopulation has ${target.markerType === 'snp' ? 'SNP' : 'microsatellite'} data on these loci yet.` }
  }
  const datasets: Record<string, GenotypeDataset> = { [target.subpopulationName]: target.dataset }
  for (const other of others) datasets[other.subpopulationName] = other.dataset
  const result = privateAlleles(datasets)
  const own = result.populations[target.subpopulationName] ?? { count: 0, alleles: [] }
  return {
    available: true,
    count: own.count,
    alleles: own.alleles.slice(0, MAX_LISTED_PRIVATE_ALLELES),
    truncated: own.alleles.length > MAX_LISTED_PRIVATE_ALLELES,
    sharedLoci: result.sharedLoci.length,
    skippedLoci: result.skippedLoci,
    comparedWith: others.map(other => other.subpopulationName),
  }
}

/**
 * Recomputes the species-relative part of every dataset's summary: allelic richness rarefied to
 * the smallest sample of its comparison set, and private alleles against the current datasets
 * of the other subpopulations (same marker type). Datasets of different marker types are never
 * compared (their loci differ).
 *
 * @param entries - every dataset of one species, parsed
 * @returns comparison per dataset id
 * @throws RangeError from the engine only for invalid datasets (entries are validated on upload)
 */
export function compareSpeciesGenotypes(entries: readonly ComparisonEntry[]): Map<number, StoredComparison> {
  const currentIds = currentDatasetIds(entries)
  const current = entries.filter(entry => currentIds.has(entry.datasetId))
  const lociOf = new Map(entries.map(entry => [entry.datasetId, new Set(entry.dataset.loci)]))
  const sharesLocus = (a: ComparisonEntry, b: ComparisonEntry): boolean => {
    const mine = lociOf.get(a.datasetId)
    return b.dataset.loci.some(locus => mine?.has(locus) ?? false)
  }
  const results = new Map<number, StoredComparison>()
  for (const target of entries) {
    const candidates = current.filter(entry => entry.markerType === target.markerType && entry.subpopulationId !== target.subpopulationId)
    const others = candidates.filter(entry => sharesLocus(target, entry))
    results.set(target.datasetId, {
      current: currentIds.has(target.datasetId),
      comparedWith: others.map(other => ({ datasetId: other.datasetId, subpopulationId: other.subpopulationId, subpopulationName: other.subpopulationName })),
      withoutSharedLoci: candidates.filter(entry => !others.includes(entry)).map(entry => entry.subpopulationName),
      richness: richnessWithin(target, others),
      privateAlleles: privateAllelesWithin(target, others),
    })
  }
  return results
}
