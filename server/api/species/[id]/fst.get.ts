/**
 * GET /api/species/:id/fst?method=hudson|weir-cockerham&markerType=microsatellite|snp
 * → 200 FstMatrixResponse: pairwise multi-locus F_ST (the engine's `fstMatrix`) between the
 * species' subpopulations that have a dataset of that marker type, each represented by its
 * current dataset (latest sampled year, then latest upload). Without `markerType`, the type
 * with the most subpopulations (microsatellites on a tie). Loci are matched by name; a
 * subpopulation whose dataset shares no locus with any other is left out of the matrix and
 * listed in `notCompared`. The diagonal is 0 by definition. Any signed-in role; another agency's species → 404; 503 when
 * storage is down.
 */
import { fstMatrix, type NamedGenotypeDataset } from '#shared/genetics'
import { FstQuerySchema, type FstMatrixResponse } from '#shared/schemas/genotypes'
import { MARKER_TYPES, type MarkerType } from '#shared/types/db'

export default defineEventHandler(async (event): Promise<FstMatrixResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const query = getQueryWith(event, FstQuerySchema)
  const { models } = await useDb()
  const species = await models.Species.findOne({ where: { id, agencyId: user.agencyId } })
  if (!species) throw notFound('Species')

  const rows = await models.GeneticDataset.findAll({
    include: [{ model: models.Subpopulation, as: 'subpopulation', where: { speciesId: species.id, agencyId: user.agencyId }, required: true, attributes: ['id', 'name'] }],
  })
  const currentIds = currentDatasetIds(rows.map(row => ({
    datasetId: row.id, subpopulationId: row.subpopulationId, markerType: row.markerType, sampledYear: row.sampledYear ?? null, createdAt: row.createdAt,
  })))
  const current = rows.filter(row => currentIds.has(row.id))
  const markerTypes = MARKER_TYPES
    .map(markerType => ({ markerType, subpopulations: current.filter(row => row.markerType === markerType).length }))
    .filter(entry => entry.subpopulations > 0)
  const busiest = [...markerTypes].sort((a, b) => b.subpopulations - a.subpopulations)[0]?.markerType ?? null
  const markerType: MarkerType | null = query.markerType ?? busiest

  const candidates = current
    .filter(row => row.markerType === markerType)
    .sort((a, b) => (a.subpopulation?.name ?? '').localeCompare(b.subpopulation?.name ?? '') || a.id - b.id)
  const loaded: { row: (typeof candidates)[number], entry: NamedGenotypeDataset }[] = []
  for (const row of candidates) loaded.push({ row, entry: { name: row.subpopulation?.name ?? `#${row.subpopulationId}`, dataset: await loadGenotypeDataset(row) } })
  const lociOf = loaded.map(item => new Set(item.entry.dataset.loci))
  const overlaps = (i: number, j: number) => [...(lociOf[i] ?? [])].filter(locus => lociOf[j]?.has(locus)).length
  const kept = loaded.filter((_, i) => loaded.length < 2 || loaded.some((__, j) => j !== i && overlaps(i, j) > 0))
  const chosen = kept.map(item => item.row)
  const named = kept.map(item => item.entry)
  const matrix = fstMatrix(named, { method: query.method })
  const keptIndex = kept.map(item => loaded.indexOf(item))
  const sharedLoci = keptIndex.map(i => keptIndex.map(j => overlaps(i, j)))

  return {
    speciesId: species.id,
    method: query.method,
    markerType,
    markerTypes,
    populations: chosen.map((row, index) => ({
      subpopulationId: row.subpopulationId,
      name: named[index]?.name ?? '',
      datasetId: row.id,
      fileName: row.fileName,
      sampledYear: row.sampledYear ?? null,
      individualCount: named[index]?.dataset.individuals.length ?? 0,
    })),
    values: matrix.values,
    sharedLoci,
    notCompared: loaded.filter(item => !kept.includes(item)).map(item => ({ subpopulationId: item.row.subpopulationId, name: item.entry.name, datasetId: item.row.id })),
  }
})
