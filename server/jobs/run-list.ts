/**
 * The `where` of GET /api/runs: the caller's agency, narrowed to a proposal and/or a scenario
 * that must themselves be the agency's (404 otherwise, like every other-agency record).
 */
import { findAgencyProposal } from '../utils/proposal-access'
import { findAgencyScenario } from '../utils/proposal-scenarios'

/**
 * @param user - the caller (agencyId)
 * @param query - optional proposalId and scenarioId
 * @returns a Sequelize `where` object for SimulationRun
 * @throws 404 when the proposal or scenario is not the caller's agency's
 */
export async function findAgencyRunFilters(user: { agencyId: number }, query: { proposalId?: number, scenarioId?: number }): Promise<Record<string, number>> {
  const where: Record<string, number> = { agencyId: user.agencyId }
  if (query.proposalId !== undefined) {
    await findAgencyProposal(user, query.proposalId)
    where.proposalId = query.proposalId
  }
  if (query.scenarioId !== undefined) {
    await findAgencyScenario(user, query.scenarioId)
    where.scenarioId = query.scenarioId
  }
  return where
}
