/**
 * GET /api/subpopulations/:id/genotypes → 200 GeneticDatasetListResponse: the subpopulation's
 * genotype datasets with their stored summaries (newest sample first), whether the caller may
 * upload, and the upload limits. Any signed-in role; another agency's subpopulation → 404.
 */
import { GENOTYPE_FILE_EXTENSIONS, GENOTYPE_FILE_MAX_BYTES, type GeneticDatasetListResponse } from '#shared/schemas/genotypes'

export default defineEventHandler(async (event): Promise<GeneticDatasetListResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const subpopulation = await requireAgencySubpopulation(user, id)
  const { models, sequelize } = await useDb()
  const rows = await models.GeneticDataset.findAll({
    where: { subpopulationId: subpopulation.id },
    include: [{ model: models.User, as: 'creator', required: false, attributes: ['id', 'name'] }],
    order: [[sequelize.literal('sampled_year IS NULL'), 'ASC'], ['sampledYear', 'DESC'], ['createdAt', 'DESC'], ['id', 'DESC']],
  }) as GeneticDatasetRow[]
  return {
    subpopulation: { id: subpopulation.id, name: subpopulation.name, speciesId: subpopulation.speciesId },
    items: rows.map(row => geneticDatasetDto(row, user)),
    canUpload: mayUploadGenotypes(user.role),
    limits: { maxBytes: GENOTYPE_FILE_MAX_BYTES, extensions: Object.keys(GENOTYPE_FILE_EXTENSIONS) },
  }
})
