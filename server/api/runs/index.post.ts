/**
 * POST /api/runs → 202 SimulationRunDto (status 'queued'): queue a simulation run.
 *
 * Body: { proposalId?, scenarioId?, model: 'establishment' | 'rescue', parameters, seed?, replicates }.
 * - 422 `{ message, issues }` when the body breaks SimulationRunCreateSchema (shape, workload
 *   limits) or the engine refuses a parameter — the issue names `parameters.<name>` and the
 *   engine's reason ("census must be an integer ≥ 1, got 0.");
 * - 404 when the proposal or scenario is not the caller's agency's; 422 when the scenario is
 *   not the proposal's;
 * - the seed is drawn (uniform unsigned 32-bit) when not given, and returned, so the run can be
 *   reproduced; the engine version is recorded with it.
 * The run row and its pg-boss job are written in one transaction, with an audit event.
 * Biologists, managers and administrators; viewers read only (403).
 */
import { randomInt } from 'node:crypto'
import { MAXIMUM_SEED, SimulationRunCreateSchema, type SimulationRunDto } from '#shared/schemas/simulation-run'
import { simulationParameterIssue } from '#shared/simulation/check-parameters'
import { SIMULATION_ENGINE_VERSION } from '#shared/simulation/engine-version'
import { appQueue, sendRunJob } from '../../jobs/app-queue'
import { RUN_STARTERS } from '../../jobs/run-access'
import { simulationRunDto, simulationRunSummaryDto } from '../../jobs/run-dto'
import { findAgencyProposal } from '../../utils/proposal-access'
import { findAgencyScenario } from '../../utils/proposal-scenarios'

export default defineEventHandler(async (event): Promise<SimulationRunDto> => {
  const user = await requireRole(event, ...RUN_STARTERS)
  const body = await readBodyWith(event, SimulationRunCreateSchema)
  const issue = simulationParameterIssue(body.model, body.parameters)
  if (issue) throw unprocessable(summariseIssues([issue]), [issue])

  let proposalId = body.proposalId ?? null
  const scenarioId = body.scenarioId ?? null
  if (scenarioId !== null) {
    const { scenario } = await findAgencyScenario(user, scenarioId)
    if (proposalId !== null && scenario.proposalId !== proposalId) {
      const mismatch = { path: 'scenarioId', message: `Scenario ${scenarioId} belongs to another proposal than ${proposalId}.` }
      throw unprocessable(summariseIssues([mismatch]), [mismatch])
    }
    proposalId = scenario.proposalId
  } else if (proposalId !== null) {
    await findAgencyProposal(user, proposalId)
  }

  const seed = body.seed ?? randomInt(0, MAXIMUM_SEED + 1)
  const queue = await appQueue(useRuntimeConfig().databaseUrl as string)
  const { sequelize, models } = await useDb()
  const run = await sequelize.transaction(async (t) => {
    const row = await models.SimulationRun.create({
      agencyId: user.agencyId,
      proposalId,
      scenarioId,
      model: body.model,
      parameters: body.parameters as unknown as Record<string, unknown>,
      seed,
      replicates: body.replicates,
      engineVersion: SIMULATION_ENGINE_VERSION,
      requestedBy: user.id,
    }, { transaction: t })
    const jobId = await sendRunJob(queue, t, row.id)
    await models.SimulationRun.update({ jobId }, { where: { id: row.id }, transaction: t })
    row.jobId = jobId
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'simulation_run.start',
      entityType: 'simulation_run', entityId: row.id, before: null, after: simulationRunSummaryDto(row, null),
    })
    return row
  })
  setResponseStatus(event, 202, 'Accepted')
  return simulationRunDto(run, { id: user.id, name: user.name })
})
