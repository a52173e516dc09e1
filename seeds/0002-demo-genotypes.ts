/**
 * Demo seed: invented microsatellite genotype tables for six of the demo subpopulations
 * (seeds/demo/genotypes/*.csv, made by generate.ts there with a fixed seed; all invented), with
 * the summaries the upload route would compute (server/utils/genotype-summary.ts): diversity,
 * and richness and private alleles compared across the species.
 *
 * The files go to object storage when it answers (`npm start` starts the local store before
 * seeding; settings from NUXT_S3_*). When it does not (tests, or a store started later), the
 * records are written anyway with their checksums, and the server puts each file in place the
 * first time it is needed (server/utils/genotype-datasets.ts, restoreDemoObject).
 *
 * Idempotent: the seed runner records it once, and `up` does nothing when demo datasets exist.
 */
import { createHash } from 'node:crypto'
import { readFileSync } from 'node:fs'
import { col, fn, Op, where } from 'sequelize'
import type { MigrationContext } from '../server/db/migrations/context'
import { initModels } from '../server/db/models'
import {
  DEMO_GENOTYPE_KEY_PREFIX,
  compareSpeciesGenotypes,
  decodeGenotypeText,
  readGenotypeText,
  summarizeGenotypeDataset,
  type ComparisonEntry,
} from '../server/utils/genotype-summary'
import { createObjectStore, objectStoreSettingsFromEnv } from '../server/utils/storage'
import { loadDemoData } from './demo/data'

interface ManifestEntry { file: string, subpopulation: string, sampledYear: number, markerType: 'microsatellite' | 'snp' }

const folder = new URL('./demo/genotypes/', import.meta.url)

function readManifest(): ManifestEntry[] {
  const manifest = JSON.parse(readFileSync(new URL('manifest.json', folder), 'utf8')) as { datasets: ManifestEntry[] }
  return manifest.datasets
}

/** Uploads the demo files when object storage answers within a few seconds; otherwise says so. */
async function uploadIfReachable(files: { key: string, bytes: Buffer }[]): Promise<void> {
  const store = createObjectStore(objectStoreSettingsFromEnv())
  const timeout = new Promise<never>((_, reject) => setTimeout(() => reject(new Error('no answer within 3 s')), 3000).unref())
  try {
    await Promise.race([store.checkReachable(), timeout])
    for (const file of files) await store.putBuffer(file.key, file.bytes, { contentType: 'text/csv; charset=utf-8' })
  } catch (error) {
    console.info(`[seed] object storage at ${store.settings.endpoint} not reachable (${error instanceof Error ? error.message : String(error)}); the demo genotype files will be put there when first needed.`)
  }
}

export async function up({ context }: { context: MigrationContext }): Promise<void> {
  const { sequelize, transaction } = context
  const { Agency, User, Species, Subpopulation, GeneticDataset } = initModels(sequelize)
  const data = loadDemoData()

  const agency = await Agency.findOne({ where: where(fn('lower', col('name')), data.agency.name.toLowerCase()), transaction })
  if (!agency) return
  const species = await Species.findOne({ where: { agencyId: agency.id, scientificName: data.species.scientificName }, transaction })
  if (!species) return
  const existing = await GeneticDataset.count({ where: { storageKey: { [Op.startsWith]: DEMO_GENOTYPE_KEY_PREFIX } }, transaction })
  if (existing > 0) return
  const biologist = await User.findOne({ where: { agencyId: agency.id, role: 'biologist' }, order: [['id', 'ASC']], transaction })

  const entries: ComparisonEntry[] = []
  const files: { key: string, bytes: Buffer }[] = []
  for (const item of readManifest()) {
    const subpopulation = await Subpopulation.findOne({ where: { agencyId: agency.id, speciesId: species.id, name: item.subpopulation }, transaction })
    if (!subpopulation) continue
    const bytes = readFileSync(new URL(item.file, folder))
    const text = decodeGenotypeText(bytes)
    const read = text === null ? null : readGenotypeText(text, 'csv')
    if (!read || !read.ok) throw new Error(`demo genotype file ${item.file} does not read: ${read?.ok === false ? read.message : 'not UTF-8'}`)
    const summary = summarizeGenotypeDataset(read.dataset)
    const key = `${DEMO_GENOTYPE_KEY_PREFIX}${item.file}`
    const row = await GeneticDataset.create({
      subpopulationId: subpopulation.id,
      storageKey: key,
      fileName: item.file,
      format: 'csv',
      markerType: item.markerType,
      sampledYear: item.sampledYear,
      summary: { ...summary },
      createdBy: biologist?.id ?? null,
      sizeBytes: bytes.length,
      checksumSha256: createHash('sha256').update(bytes).digest('hex'),
    }, { transaction })
    files.push({ key, bytes })
    entries.push({
      datasetId: row.id,
      subpopulationId: subpopulation.id,
      subpopulationName: subpopulation.name,
      markerType: item.markerType,
      sampledYear: item.sampledYear,
      createdAt: row.createdAt,
      dataset: read.dataset,
      smallestGeneCount: summary.smallestGeneCount,
    })
  }

  const comparisons = compareSpeciesGenotypes(entries)
  for (const entry of entries) {
    const row = await GeneticDataset.findByPk(entry.datasetId, { transaction })
    const comparison = comparisons.get(entry.datasetId)
    if (row && comparison) await row.update({ summary: { ...row.summary, comparison } }, { transaction })
  }
  await uploadIfReachable(files)
}

/** Removes the demo genotype records (their stored files stay; they are harmless). */
export async function down({ context }: { context: MigrationContext }): Promise<void> {
  const { sequelize, transaction } = context
  const { GeneticDataset } = initModels(sequelize)
  await GeneticDataset.destroy({ where: { storageKey: { [Op.startsWith]: DEMO_GENOTYPE_KEY_PREFIX } }, transaction })
}
