/**
 * DELETE /api/runs/:id → 200 SimulationRunDto (status 'cancelled'): cancel a queued or running
 * run. The row is marked cancelled and its pg-boss job cancelled in one transaction (with an
 * audit event); a worker running it notices at its next heartbeat or finished block and stops
 * (no result is stored). 409 when the run already finished; 404 for another agency's run.
 * Biologists, managers and administrators; viewers read only (403).
 */
import { FINISHED_RUN_STATUSES, type SimulationRunDto } from '#shared/schemas/simulation-run'
import { appQueue, cancelRunJob } from '../../jobs/app-queue'
import { RUN_STARTERS, findAgencyRun, requesters } from '../../jobs/run-access'
import { simulationRunDto, simulationRunSummaryDto } from '../../jobs/run-dto'

export default defineEventHandler(async (event): Promise<SimulationRunDto> => {
  const user = await requireRole(event, ...RUN_STARTERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  await findAgencyRun(user, id) // 404 before touching the queue
  const queue = await appQueue(useRuntimeConfig().databaseUrl as string)
  const { sequelize } = await useDb()
  const run = await sequelize.transaction(async (t) => {
    const row = await findAgencyRun(user, id, { transaction: t, lock: true })
    if (FINISHED_RUN_STATUSES.includes(row.status)) {
      throw conflict(`This simulation run has already ${row.status === 'cancelled' ? 'been cancelled' : row.status}; there is nothing to cancel.`)
    }
    const names = await requesters([row], t)
    const requester = row.requestedBy === null ? null : names.get(row.requestedBy) ?? null
    const before = simulationRunSummaryDto(row, requester)
    row.status = 'cancelled'
    row.finishedAt = new Date()
    row.heartbeatAt = null
    await row.save({ transaction: t })
    if (row.jobId) await cancelRunJob(queue, t, row.jobId)
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'simulation_run.cancel',
      entityType: 'simulation_run', entityId: row.id, before, after: simulationRunSummaryDto(row, requester),
    })
    return { row, requester }
  })
  return simulationRunDto(run.row, run.requester)
})
