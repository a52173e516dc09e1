/**
 * GET /api/subpopulations?speciesId= → 200 { items: SubpopulationDto[] } — the agency's
 * subpopulations (of one species when `speciesId` is given) by name, with boundary, latest
 * census, latest Ne estimate, working effective size and status. 404 when the species belongs
 * to another agency. Any signed-in role. Remembered until the records change (server/utils/read-cache.ts).
 */
import { z } from 'zod'
import type { SubpopulationListResponse } from '#shared/atlas/types'
import { ownSpecies } from '../../atlas/records'
import { loadSubpopulationDtos } from '../../atlas/subpopulation-dto'

/** What the answer reads: the species check, the rows, their latest census and estimates. */
const SUBPOPULATION_LIST_TABLES = ['species', 'subpopulations', 'census_counts', 'effective_size_estimates'] as const

const QuerySchema = z.object({
  speciesId: RecordIdSchema.optional(),
})

export default defineEventHandler(async (event): Promise<SubpopulationListResponse> => {
  const user = await requireUser(event)
  const { speciesId } = getQueryWith(event, QuerySchema)
  return rememberedRead(event, `subpopulations:${user.agencyId}:${speciesId ?? 'all'}`, SUBPOPULATION_LIST_TABLES, async () => {
    const db = await useDb()
    if (speciesId !== undefined) await ownSpecies(db.models, user.agencyId, speciesId)
    const items = await loadSubpopulationDtos(db, { agencyId: user.agencyId, ...(speciesId === undefined ? {} : { speciesId }) })
    return { items }
  })
})
