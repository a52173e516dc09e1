/**
 * GET /api/runs?proposalId=&scenarioId=&limit= → 200 { items: SimulationRunSummaryDto[] }: the
 * agency's runs, newest first (at most `limit`, default 20, ≤ 100), for one proposal and/or one
 * scenario when given — without results (GET /api/runs/:id has them). A proposal or scenario of
 * another agency → 404. Any signed-in role.
 */
import { SimulationRunListQuerySchema, type SimulationRunListResponse } from '#shared/schemas/simulation-run'
import { findAgencyRunFilters } from '../../jobs/run-list'
import { requesters } from '../../jobs/run-access'
import { simulationRunSummaryDto } from '../../jobs/run-dto'

export default defineEventHandler(async (event): Promise<SimulationRunListResponse> => {
  const user = await requireUser(event)
  const query = getQueryWith(event, SimulationRunListQuerySchema)
  const where = await findAgencyRunFilters(user, query)
  const { models } = await useDb()
  const rows = await models.SimulationRun.findAll({
    where,
    attributes: { exclude: ['result'] },
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: query.limit,
  })
  const names = await requesters(rows)
  return { items: rows.map(row => simulationRunSummaryDto(row, row.requestedBy === null ? null : names.get(row.requestedBy) ?? null)) }
})
