/**
 * POST /api/subpopulations { speciesId, name, environmentClass?, generationTimeYears,
 * yearsIsolated?, notes?, geometry? } → 201 SubpopulationDto.
 * The boundary is checked (structure, self-intersection, plausible area; 422 naming the
 * problem); centroid and area are derived from it. 404 when the species belongs to another
 * agency; 409 when the species already has a subpopulation of that name.
 * Biologists, managers and administrators.
 */
import { SubpopulationCreateSchema } from '#shared/schemas/subpopulation'
import type { SubpopulationDto } from '#shared/atlas/types'
import { deriveGeometryFigures } from '../../db/derive-geometry'
import { ATLAS_WRITERS, ownSpecies, requireFreeName } from '../../atlas/records'
import { dtosOf, subpopulationAuditSnapshot } from '../../atlas/subpopulation-dto'

export default defineEventHandler(async (event): Promise<SubpopulationDto> => {
  const user = await requireRole(event, ...ATLAS_WRITERS)
  const input = await readBodyWith(event, SubpopulationCreateSchema, { maxBytes: 2 * 1024 * 1024 })
  const { sequelize, models } = await useDb()

  const dto = await sequelize.transaction(async (transaction) => {
    const species = await ownSpecies(models, user.agencyId, input.speciesId, transaction)
    await requireFreeName(models, species.id, input.name, null, transaction)
    const figures = input.geometry ? deriveGeometryFigures(input.geometry) : { centroidLon: null, centroidLat: null, areaKm2: null }
    const row = await models.Subpopulation.create({
      agencyId: user.agencyId,
      speciesId: species.id,
      name: input.name,
      geometry: input.geometry,
      ...figures,
      environmentClass: input.environmentClass,
      yearsIsolated: input.yearsIsolated,
      generationTimeYears: input.generationTimeYears,
      notes: input.notes,
    }, { transaction })
    await recordAudit(transaction, {
      agencyId: user.agencyId, actorId: user.id, action: 'subpopulation.create',
      entityType: 'subpopulation', entityId: row.id, before: null, after: subpopulationAuditSnapshot(row),
    })
    const [created] = await dtosOf(sequelize, [row], transaction)
    return created
  })
  setResponseStatus(event, 201)
  return dto as SubpopulationDto // dtosOf returns one DTO per row given
})
