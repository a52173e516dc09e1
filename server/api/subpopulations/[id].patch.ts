/**
 * PATCH /api/subpopulations/:id { name?, environmentClass?, generationTimeYears?,
 * yearsIsolated?, notes?, geometry?, workingNe?, workingNeReason?, version } → 200
 * SubpopulationDto.
 * `geometry: null` removes the boundary; a new boundary is checked (422 naming the problem) and
 * its centroid and area are derived again. A working Ne needs its reason in the same request.
 * 409 when `version` is not the current one (someone saved in between: reload and redo) or
 * when the new name is taken; 404 for another agency's record. Biologists, managers and
 * administrators.
 */
import { SubpopulationPatchSchema } from '#shared/schemas/subpopulation'
import type { SubpopulationDto } from '#shared/atlas/types'
import { deriveGeometryFigures } from '../../db/derive-geometry'
import { ATLAS_WRITERS, ownSubpopulation, requireFreeName } from '../../atlas/records'
import { dtosOf, subpopulationAuditSnapshot } from '../../atlas/subpopulation-dto'

export default defineEventHandler(async (event): Promise<SubpopulationDto> => {
  const user = await requireRole(event, ...ATLAS_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const patch = await readBodyWith(event, SubpopulationPatchSchema, { maxBytes: 2 * 1024 * 1024 })
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (transaction) => {
    const row = await ownSubpopulation(models, user.agencyId, id, transaction)
    if (row.version !== patch.version) {
      throw conflict(`Someone else saved "${row.name}" since you loaded it (you had version ${patch.version}, it is now ${row.version}). Reload to see their change, then make yours again.`)
    }
    if (patch.name !== undefined && patch.name.toLowerCase() !== row.name.toLowerCase()) {
      await requireFreeName(models, row.speciesId, patch.name, row.id, transaction)
    }
    const before = subpopulationAuditSnapshot(row)
    if (patch.name !== undefined) row.name = patch.name
    if (patch.environmentClass !== undefined) row.environmentClass = patch.environmentClass
    if (patch.generationTimeYears !== undefined) row.generationTimeYears = patch.generationTimeYears
    if (patch.yearsIsolated !== undefined) row.yearsIsolated = patch.yearsIsolated
    if (patch.notes !== undefined) row.notes = patch.notes
    if (patch.workingNe !== undefined) {
      row.workingNe = patch.workingNe
      row.workingNeReason = patch.workingNe === null ? null : patch.workingNeReason ?? null
    } else if (patch.workingNeReason !== undefined) {
      if (patch.workingNeReason === null && row.workingNe !== null) {
        throw unprocessable('workingNeReason: A working Ne needs its reason; clear the working Ne to remove both.', [
          { path: 'workingNeReason', message: 'A working Ne needs its reason; clear the working Ne to remove both.' },
        ])
      }
      row.workingNeReason = patch.workingNeReason
    }
    if (patch.geometry !== undefined) {
      row.geometry = patch.geometry
      const figures = patch.geometry ? deriveGeometryFigures(patch.geometry) : { centroidLon: null, centroidLat: null, areaKm2: null }
      row.centroidLon = figures.centroidLon
      row.centroidLat = figures.centroidLat
      row.areaKm2 = figures.areaKm2
    }
    if (row.changed()) {
      await row.save({ transaction })
      await recordAudit(transaction, {
        agencyId: user.agencyId, actorId: user.id, action: 'subpopulation.update',
        entityType: 'subpopulation', entityId: row.id, before, after: subpopulationAuditSnapshot(row),
      })
    }
    const [dto] = await dtosOf(sequelize, [row], transaction)
    return dto as SubpopulationDto // dtosOf returns one DTO per row given
  })
})
