/**
 * Simulation runs as the API returns them (shared/schemas/simulation-run.ts DTOs). Pure
 * mapping from the model row; the routes load the requesters' names.
 */
import type { SimulationRun } from '../db/models'
import type {
  EstablishmentParameters, RescueParameters, SimulationResult, SimulationRunDto, SimulationRunPersonDto, SimulationRunSummaryDto,
} from '../../shared/schemas/simulation-run'

const iso = (value: Date | null | undefined): string | null => (value ? new Date(value).toISOString() : null)

/**
 * The list form of a run (no result).
 *
 * @param run - the row
 * @param requester - id and name of who asked for it, or null (unknown or deleted)
 */
export function simulationRunSummaryDto(run: SimulationRun, requester: SimulationRunPersonDto | null): SimulationRunSummaryDto {
  return {
    id: run.id,
    proposalId: run.proposalId,
    scenarioId: run.scenarioId,
    model: run.model,
    parameters: run.parameters as EstablishmentParameters | RescueParameters,
    seed: Number(run.seed),
    replicates: run.replicates,
    engineVersion: run.engineVersion,
    status: run.status,
    progress: run.progress,
    error: run.error ?? null,
    attempts: run.attempts,
    requestedBy: requester,
    createdAt: iso(run.createdAt) ?? '',
    startedAt: iso(run.startedAt),
    finishedAt: iso(run.finishedAt),
    version: run.version,
  }
}

/** The full form of a run, with its result once it succeeded. */
export function simulationRunDto(run: SimulationRun, requester: SimulationRunPersonDto | null): SimulationRunDto {
  return {
    ...simulationRunSummaryDto(run, requester),
    result: run.status === 'succeeded' ? (run.result as unknown as SimulationResult | null) ?? null : null,
  }
}
