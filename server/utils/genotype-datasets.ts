/**
 * Genotype datasets on the server: finding them inside the user's agency, reading their files
 * back from object storage (parsed once and kept in a small in-process cache; objects are never
 * overwritten, so a key always means the same bytes), recomputing the species comparisons when a
 * dataset is added or deleted, and the DTOs the routes answer with.
 *
 * Demo datasets (seeds/0002-demo-genotypes.ts) live under `seed/demo-genotypes/`; when such an
 * object is missing (a fresh object store, or one started after the seed ran) it is put back
 * from the committed file in seeds/demo/genotypes/, after its SHA-256 is checked.
 */
import { createHash } from 'node:crypto'
import { readFile } from 'node:fs/promises'
import { resolve } from 'node:path'
import type { Transaction } from 'sequelize'
import type { GenotypeDataset } from '#shared/genetics'
import {
  GENOTYPE_FILE_EXTENSIONS,
  GENOTYPE_FILE_MAX_BYTES,
  GenotypeUploadFieldsSchema,
  genotypeFormatOf,
  type GeneticDatasetDetailDto,
  type GeneticDatasetDto,
  type GeneticDiversityOverview,
  type GeneticLocusRow,
} from '#shared/schemas/genotypes'
import type { GeneticDataset, Subpopulation, User } from '../db/models'
import {
  DEMO_GENOTYPE_FOLDER,
  DEMO_GENOTYPE_KEY_PREFIX,
  compareSpeciesGenotypes,
  decodeGenotypeText,
  readGenotypeText,
  summarizeGenotypeDataset,
  type ComparisonEntry,
  type StoredGenotypeSummary,
} from './genotype-summary'
import type { CurrentUser } from './auth'
import type { UploadRequest, UploadTypeRule } from './uploads'

/** A dataset row, with its uploader when the query included `creator`. */
export type GeneticDatasetRow = GeneticDataset & { creator?: Pick<User, 'id' | 'name'> | null }

/** The stored summary of a row (null before it was computed). */
export function storedSummaryOf(row: Pick<GeneticDataset, 'summary'>): StoredGenotypeSummary | null {
  return (row.summary ?? null) as unknown as StoredGenotypeSummary | null
}

/** Roles that may upload genotype files. */
export const GENOTYPE_UPLOAD_ROLES = ['biologist', 'manager', 'administrator'] as const

/** Whether `role` may upload genotype files (for the `canUpload` flag of the list). */
export function mayUploadGenotypes(role: CurrentUser['role']): boolean {
  return (GENOTYPE_UPLOAD_ROLES as readonly string[]).includes(role)
}

/** The uploader or an administrator may delete a dataset. */
export function mayDeleteDataset(user: CurrentUser, dataset: Pick<GeneticDataset, 'createdBy'>): boolean {
  return user.role === 'administrator' || (user.role !== 'viewer' && dataset.createdBy === user.id)
}

/** The subpopulation `id` if it belongs to the user's agency; 404 otherwise. */
export async function requireAgencySubpopulation(user: CurrentUser, id: number, transaction?: Transaction): Promise<Subpopulation> {
  const { models } = await useDb()
  const subpopulation = await models.Subpopulation.findOne({ where: { id, agencyId: user.agencyId }, transaction })
  if (!subpopulation) throw notFound('Subpopulation')
  return subpopulation
}

/** The dataset `id` (with its subpopulation and creator) if it belongs to the user's agency; 404 otherwise. */
export async function requireAgencyDataset(user: CurrentUser, id: number, transaction?: Transaction): Promise<GeneticDatasetRow> {
  const { models } = await useDb()
  const dataset = await models.GeneticDataset.findOne({
    where: { id },
    include: [
      { model: models.Subpopulation, as: 'subpopulation', where: { agencyId: user.agencyId }, required: true },
      { model: models.User, as: 'creator', required: false, attributes: ['id', 'name'] },
    ],
    transaction,
  })
  if (!dataset) throw notFound('Genotype dataset')
  return dataset
}

// ---------------------------------------------------------------------------------------------
// Reading files back

interface CachedDataset { checksum: string, dataset: GenotypeDataset, cells: number }

/** Parsed datasets kept in memory, at most this many genotype cells in all. */
const CACHE_CELL_BUDGET = 5_000_000
const cache = new Map<string, CachedDataset>()
let cachedCells = 0

function remember(key: string, entry: CachedDataset): void {
  cache.delete(key)
  cache.set(key, entry)
  cachedCells += entry.cells
  for (const [oldKey, old] of cache) {
    if (cachedCells <= CACHE_CELL_BUDGET || cache.size <= 1) break
    cache.delete(oldKey)
    cachedCells -= old.cells
  }
}

/** Forgets a parsed dataset (after its record is deleted). */
export function forgetGenotypeDataset(storageKey: string): void {
  const held = cache.get(storageKey)
  if (held) {
    cache.delete(storageKey)
    cachedCells -= held.cells
  }
}

/** Keeps a freshly parsed upload, so the next comparison need not download it. */
export function rememberGenotypeDataset(storageKey: string, checksum: string, dataset: GenotypeDataset): void {
  remember(storageKey, { checksum, dataset, cells: dataset.individuals.length * dataset.loci.length })
}

function sha256(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex')
}

/** Puts a demo object back from the committed seed file; null when `key` is not a demo key or the file differs. */
async function restoreDemoObject(key: string, checksum: string): Promise<Buffer | null> {
  if (!key.startsWith(DEMO_GENOTYPE_KEY_PREFIX)) return null
  const name = key.slice(DEMO_GENOTYPE_KEY_PREFIX.length)
  if (!/^[a-z0-9-]+\.(csv|vcf)$/.test(name)) return null
  const bytes = await readFile(resolve(process.cwd(), DEMO_GENOTYPE_FOLDER, name)).catch(() => null)
  if (!bytes || sha256(bytes) !== checksum) return null
  await useObjectStore().putBuffer(key, bytes, { contentType: name.endsWith('.vcf') ? 'text/plain; charset=utf-8' : 'text/csv; charset=utf-8' })
  console.info(`[genotypes] restored demo object ${key} from ${DEMO_GENOTYPE_FOLDER}`)
  return bytes
}

function missingFile(row: Pick<GeneticDataset, 'id' | 'storageKey'>, why: string): Error {
  return new Error(`genotype dataset ${row.id}: ${why} (storage key ${row.storageKey})`)
}

/**
 * The parsed dataset of a stored genotype file (from the cache, else downloaded and parsed).
 *
 * @throws 503 when storage is down; an Error (answered 500 and logged) when the object is
 *   missing or its bytes no longer match the recorded checksum
 */
export async function loadGenotypeDataset(row: Pick<GeneticDataset, 'id' | 'storageKey' | 'checksumSha256' | 'format'>): Promise<GenotypeDataset> {
  const held = cache.get(row.storageKey)
  if (held && held.checksum === row.checksumSha256) return held.dataset
  let bytes: Buffer
  try {
    bytes = await useObjectStore().getBuffer(row.storageKey, GENOTYPE_FILE_MAX_BYTES)
  } catch (error) {
    if (!isMissingObject(error)) throw asObjectStoreError(error, 'read')
    const restored = await restoreDemoObject(row.storageKey, row.checksumSha256).catch((restoreError: unknown) => {
      throw asObjectStoreError(restoreError, 'read')
    })
    if (!restored) throw missingFile(row, 'the file is missing from object storage')
    bytes = restored
  }
  if (sha256(bytes) !== row.checksumSha256) throw missingFile(row, 'the stored file does not match its recorded checksum')
  const text = decodeGenotypeText(bytes)
  const read = text === null ? null : readGenotypeText(text, row.format)
  if (!read || !read.ok) throw missingFile(row, 'the stored file can no longer be read')
  rememberGenotypeDataset(row.storageKey, row.checksumSha256, read.dataset)
  return read.dataset
}

// ---------------------------------------------------------------------------------------------
// Species comparisons

/**
 * Recomputes richness and private alleles of every dataset of the species (see
 * compareSpeciesGenotypes) and stores them, inside `transaction`. Takes a row lock on the
 * species first, so two uploads in one species never compute from each other's half-state.
 */
export async function refreshSpeciesComparisons(transaction: Transaction, speciesId: number): Promise<void> {
  const { models } = await useDb()
  await models.Species.findOne({ where: { id: speciesId }, lock: transaction.LOCK.UPDATE, transaction })
  const rows = await models.GeneticDataset.findAll({
    include: [{ model: models.Subpopulation, as: 'subpopulation', where: { speciesId }, required: true, attributes: ['id', 'name'] }],
    order: [['id', 'ASC']],
    transaction,
  })
  const entries: ComparisonEntry[] = []
  for (const row of rows) {
    const summary = storedSummaryOf(row)
    if (!summary?.smallestGeneCount) continue
    entries.push({
      datasetId: row.id,
      subpopulationId: row.subpopulationId,
      subpopulationName: row.subpopulation?.name ?? `#${row.subpopulationId}`,
      markerType: row.markerType,
      sampledYear: row.sampledYear ?? null,
      createdAt: row.createdAt,
      dataset: await loadGenotypeDataset(row),
      smallestGeneCount: summary.smallestGeneCount,
    })
  }
  const comparisons = compareSpeciesGenotypes(entries)
  for (const row of rows) {
    const comparison = comparisons.get(row.id)
    const summary = storedSummaryOf(row)
    if (!comparison || !summary) continue
    if (JSON.stringify(summary.comparison) === JSON.stringify(comparison)) continue
    await models.GeneticDataset.update({ summary: { ...summary, comparison } }, { where: { id: row.id }, transaction })
  }
}

// ---------------------------------------------------------------------------------------------
// DTOs

function diversityOverview(summary: StoredGenotypeSummary | null): GeneticDiversityOverview {
  const overall = summary?.diversity.overall
  return {
    individualCount: overall?.individualCount ?? 0,
    genotypedIndividualCount: overall?.genotypedIndividualCount ?? 0,
    locusCount: summary?.diversity.loci.length ?? 0,
    lociInMeans: overall?.lociInMeans.length ?? 0,
    monomorphicLoci: overall?.monomorphicLoci.length ?? 0,
    lociWithoutData: overall?.lociWithoutData ?? [],
    missingGenotypeFraction: overall?.missingGenotypeFraction ?? 0,
    meanSampleSize: overall?.meanSampleSize ?? null,
    meanAlleleCount: overall?.meanAlleleCount ?? null,
    observedHeterozygosity: overall?.meanObservedHeterozygosity ?? null,
    expectedHeterozygosity: overall?.meanExpectedHeterozygosity ?? null,
    inbreedingCoefficient: overall?.inbreedingCoefficient ?? null,
    includesMonomorphicLoci: summary?.diversity.includesMonomorphicLoci ?? true,
  }
}

const NOT_COMPARED = 'Not compared yet.'

/** The list form of a dataset row (needs `creator` included for the uploader's name). */
export function geneticDatasetDto(row: GeneticDatasetRow, user: CurrentUser): GeneticDatasetDto {
  const summary = storedSummaryOf(row)
  const comparison = summary?.comparison ?? null
  const richness = comparison?.richness
  const privateList = comparison?.privateAlleles
  return {
    id: row.id,
    subpopulationId: row.subpopulationId,
    fileName: row.fileName,
    format: row.format,
    markerType: row.markerType,
    sampledYear: row.sampledYear ?? null,
    sizeBytes: row.sizeBytes,
    checksumSha256: row.checksumSha256,
    createdAt: row.createdAt.toISOString(),
    createdBy: row.creator ? { id: row.creator.id, name: row.creator.name } : null,
    version: row.version,
    current: comparison?.current ?? false,
    diversity: diversityOverview(summary),
    allelicRichness: !richness
      ? { available: false, reason: NOT_COMPARED }
      : richness.available
        ? {
            available: true,
            rarefactionSize: richness.rarefactionSize,
            limitedBy: richness.limitedBy,
            meanRichness: richness.result.meanRichness,
            meanAlleleCount: richness.result.meanAlleleCount,
          }
        : richness,
    privateAlleles: !privateList
      ? { available: false, reason: NOT_COMPARED }
      : privateList.available
        ? { available: true, count: privateList.count, sharedLocusCount: privateList.sharedLoci, skippedLoci: privateList.skippedLoci, comparedWith: privateList.comparedWith }
        : privateList,
    comparedWith: comparison?.comparedWith ?? [],
    withoutSharedLoci: comparison?.withoutSharedLoci ?? [],
    canDelete: mayDeleteDataset(user, row),
  }
}

/** The detail form: the list form plus one row per locus. */
export function geneticDatasetDetailDto(row: GeneticDatasetRow, user: CurrentUser): GeneticDatasetDetailDto {
  const summary = storedSummaryOf(row)
  const comparison = summary?.comparison ?? null
  const richnessByLocus = new Map<string, number>()
  if (comparison?.richness.available) {
    for (const locus of comparison.richness.result.loci) richnessByLocus.set(locus.locus, locus.richness)
  }
  const privateByLocus = new Map<string, string[]>()
  const privateList = comparison?.privateAlleles
  if (privateList?.available) {
    for (const { locus, allele } of privateList.alleles) privateByLocus.set(locus, [...(privateByLocus.get(locus) ?? []), allele])
  }
  const loci: GeneticLocusRow[] = (summary?.diversity.loci ?? []).map(locus => ({
    locus: locus.locus,
    sampleSize: locus.sampleSize,
    alleleCount: locus.alleleCount,
    alleleCounts: locus.alleleCounts,
    observedHeterozygosity: locus.observedHeterozygosity,
    expectedHeterozygosity: locus.expectedHeterozygosity,
    inbreedingCoefficient: locus.inbreedingCoefficient,
    monomorphic: locus.monomorphic,
    allelicRichness: richnessByLocus.get(locus.locus) ?? null,
    privateAlleles: privateList?.available ? privateByLocus.get(locus.locus) ?? [] : null,
  }))
  return {
    ...geneticDatasetDto(row, user),
    loci,
    privateAlleleListTruncated: privateList?.available ? privateList.truncated : false,
  }
}

/** What the audit log keeps of a dataset (no per-locus detail). */
export function geneticDatasetAuditSnapshot(row: GeneticDataset): Record<string, unknown> {
  const summary = storedSummaryOf(row)
  return {
    id: row.id,
    subpopulationId: row.subpopulationId,
    fileName: row.fileName,
    format: row.format,
    markerType: row.markerType,
    sampledYear: row.sampledYear ?? null,
    sizeBytes: row.sizeBytes,
    checksumSha256: row.checksumSha256,
    storageKey: row.storageKey,
    individualCount: summary?.diversity.overall.individualCount ?? null,
    locusCount: summary?.diversity.loci.length ?? null,
  }
}

/** Reads an uploaded genotype file; 422 naming the line/locus and the reason when it is not usable. */
export function parseUploadedGenotypes(content: Buffer, format: 'csv' | 'vcf'): GenotypeDataset {
  const text = decodeGenotypeText(content)
  if (text === null) {
    throw unprocessable('The file is not UTF-8 text. Save it as CSV (UTF-8) or as a plain-text VCF and upload it again.', [{ path: 'file', message: 'The file is not UTF-8 text.' }])
  }
  const read = readGenotypeText(text, format)
  if (!read.ok) throw unprocessable(read.message, read.issues)
  return read.dataset
}

// ---------------------------------------------------------------------------------------------
// Upload

/** Accepted genotype files: text, by name ending. */
export const GENOTYPE_UPLOAD_TYPES: readonly UploadTypeRule[] = Object.entries(GENOTYPE_FILE_EXTENSIONS).map(([extension, format]) => ({
  extension,
  contentType: format === 'vcf' ? 'text/plain; charset=utf-8' : 'text/csv; charset=utf-8',
  label: format === 'vcf' ? 'VCF' : 'CSV',
  sniff: fileSignatureChecks.text,
}))

/**
 * The whole upload of one genotype file, all or nothing: streams it to object storage, reads
 * the form fields, parses and validates the file, computes the summary, then in one transaction
 * inserts the record, recomputes the species comparisons and writes the audit row. When any
 * step fails the stored object is removed again.
 *
 * @returns the new row (with its creator)
 * @throws 413 / 415 / 422 for the file, 422 for the fields, 503 when storage is down
 */
export async function createGenotypeDataset(request: UploadRequest, user: CurrentUser, subpopulation: Subpopulation): Promise<GeneticDatasetRow> {
  const key = objectKey('genotypes', user.agencyId, subpopulation.id, '')
  const upload = await receiveUploadIntoStorage(request, key, {
    maxFileBytes: GENOTYPE_FILE_MAX_BYTES,
    types: GENOTYPE_UPLOAD_TYPES,
    fieldNames: ['markerType', 'sampledYear'],
    keepContent: true,
  })
  try {
    const fields = parseInputOrThrow(GenotypeUploadFieldsSchema, upload.fields)
    const format = genotypeFormatOf(upload.file.fileName) ?? 'csv'
    if (format === 'vcf' && fields.markerType !== 'snp') {
      const message = 'A VCF file holds SNPs: choose the marker type "SNPs".'
      throw unprocessable(message, [{ path: 'markerType', message }])
    }
    const dataset = parseUploadedGenotypes(upload.file.content ?? Buffer.alloc(0), format)
    const summary = summarizeGenotypeDataset(dataset)
    rememberGenotypeDataset(key, upload.file.sha256, dataset)
    const { sequelize, models } = await useDb()
    return await sequelize.transaction(async (transaction) => {
      const created = await models.GeneticDataset.create({
        subpopulationId: subpopulation.id,
        storageKey: key,
        fileName: upload.file.fileName,
        format,
        markerType: fields.markerType,
        sampledYear: fields.sampledYear ?? null,
        summary: { ...summary },
        createdBy: user.id,
        sizeBytes: upload.file.sizeBytes,
        checksumSha256: upload.file.sha256,
      }, { transaction })
      await refreshSpeciesComparisons(transaction, subpopulation.speciesId)
      const row = await requireAgencyDataset(user, created.id, transaction)
      await recordAudit(transaction, {
        agencyId: user.agencyId, actorId: user.id, action: 'genotype-dataset.upload',
        entityType: 'genetic_dataset', entityId: row.id, before: null, after: geneticDatasetAuditSnapshot(row),
      })
      return row
    })
  } catch (error) {
    forgetGenotypeDataset(key)
    await discardStoredObject(key)
    throw asObjectStoreError(error)
  }
}

/**
 * Deletes a dataset, all or nothing: in one transaction the record goes, the species
 * comparisons are recomputed without it and the audit row is written; the stored file is
 * removed after the commit (a file left over is harmless, a record without its file is not).
 */
export async function deleteGenotypeDataset(user: CurrentUser, id: number): Promise<void> {
  const { sequelize } = await useDb()
  const key = await sequelize.transaction(async (transaction) => {
    const row = await requireAgencyDataset(user, id, transaction)
    if (!mayDeleteDataset(user, row)) {
      throw forbidden('Only the person who uploaded this dataset, or an administrator, can delete it.')
    }
    const before = geneticDatasetAuditSnapshot(row)
    const speciesId = row.subpopulation?.speciesId
    const { models } = await useDb()
    // Counted, so a concurrent delete of the same dataset answers 404 instead of auditing twice.
    const removed = await models.GeneticDataset.destroy({ where: { id: row.id }, transaction })
    if (removed === 0) throw notFound('Genotype dataset')
    if (speciesId !== undefined) await refreshSpeciesComparisons(transaction, speciesId)
    await recordAudit(transaction, {
      agencyId: user.agencyId, actorId: user.id, action: 'genotype-dataset.delete',
      entityType: 'genetic_dataset', entityId: id, before, after: null,
    })
    return row.storageKey
  }).catch((error: unknown) => {
    throw asObjectStoreError(error)
  })
  forgetGenotypeDataset(key)
  await discardStoredObject(key)
}
