/**
 * GET /api/runs/:id → 200 SimulationRunDto: status, progress (0–1), and the result once the run
 * succeeded (the engine's `simulateEstablishment` / `simulateRescue` output; values JSON cannot
 * hold, such as NaN, come back as null), with the parameters, seed, replicates and engine
 * version that reproduce it. Any signed-in role of the run's agency; another agency's → 404.
 */
import type { SimulationRunDto } from '#shared/schemas/simulation-run'
import { findAgencyRun, requesters } from '../../jobs/run-access'
import { simulationRunDto } from '../../jobs/run-dto'

export default defineEventHandler(async (event): Promise<SimulationRunDto> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const run = await findAgencyRun(user, id)
  const names = await requesters([run])
  return simulationRunDto(run, run.requestedBy === null ? null : names.get(run.requestedBy) ?? null)
})
