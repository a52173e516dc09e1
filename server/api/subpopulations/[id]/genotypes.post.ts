/**
 * POST /api/subpopulations/:id/genotypes (multipart/form-data: `file`, `markerType`
 * 'microsatellite' | 'snp', optional `sampledYear`) → 201 GeneticDatasetDto.
 *
 * The file (CSV with two columns per locus, or VCF 4.x of biallelic SNPs; at most 10 MB) is
 * streamed to object storage, parsed and validated by the engine and summarised; the record,
 * the recomputed species comparisons and the audit row are written in one transaction. All or
 * nothing: on any failure the stored file is removed again.
 * Answers: 413 over the limit (before the body is read when Content-Length says so), 415 for
 * another file type, 422 naming the line/locus and the reason for a malformed file or bad
 * fields, 503 when storage is down (nothing recorded). Biologists, managers and
 * administrators; viewers 403; another agency's subpopulation 404.
 */
import type { GeneticDatasetDto } from '#shared/schemas/genotypes'

export default defineEventHandler(async (event): Promise<GeneticDatasetDto> => {
  const user = await requireRole(event, 'biologist', 'manager', 'administrator')
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const subpopulation = await requireAgencySubpopulation(user, id)
  const row = await createGenotypeDataset(event.node.req, user, subpopulation)
  setResponseStatus(event, 201)
  return geneticDatasetDto(row, user)
})
