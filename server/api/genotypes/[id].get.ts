/**
 * GET /api/genotypes/:id → 200 GeneticDatasetDetailDto: the dataset with one row per locus
 * (sample size, alleles and their counts, Ho, He, F_IS, rarefied richness, private alleles).
 * Any signed-in role; another agency's dataset → 404.
 */
import type { GeneticDatasetDetailDto } from '#shared/schemas/genotypes'

export default defineEventHandler(async (event): Promise<GeneticDatasetDetailDto> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const row = await requireAgencyDataset(user, id)
  return geneticDatasetDetailDto(row, user)
})
