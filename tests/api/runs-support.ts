/**
 * Helpers for the simulation-run API tests: parameters of both models sized for tests, waiting
 * for a run to reach a status, and the engine's own answer to compare with.
 */
import type { EstablishmentParams, RescueParams } from '../../shared/genetics'
import type { SimulationRunDto } from '../../shared/schemas/simulation-run'
import type { ApiClient } from '../support/client'
import { eventually } from '../support/server'

/** Allele-frequency model: runs 3000 replicates in well under a second. */
export const establishmentParameters: EstablishmentParams = {
  census: 60, effectiveSize: 20, s: 0.05, h: 0.5, sourceFrequency: 0.3,
  migrantsPerEvent: 4, eventInterval: 2, events: 3, firstEventGeneration: 1, generations: 200,
}

/** Individual-based model: about a quarter of a second per replicate on one core. */
export const rescueParameters: RescueParams = {
  recipient: { census: 60, effectiveRatio: 0.5, burnInGenerations: 100 },
  source: { census: 150, burnInGenerations: 100 },
  generations: 50,
  adaptive: { s: 0.05, h: 0.5, sourceFrequency: 0.4 },
  translocation: { migrantsPerEvent: 4, eventInterval: 5, events: 4 },
}

/** A value as it comes back through JSON (NaN → null, no undefined keys). */
export function viaJson<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T
}

/** A run as GET /api/runs/:id returns it (loosely typed for tests). */
export type RunBody = SimulationRunDto & Record<string, unknown>

/** Polls GET /api/runs/:id until `accept(run)` holds; returns that run. */
export async function waitForRun(client: ApiClient, id: number, accept: (run: RunBody) => boolean, timeoutMs = 90_000): Promise<RunBody> {
  return eventually(async () => {
    const response = await client.get(`/api/runs/${id}`)
    if (response.status !== 200) throw new Error(`GET /api/runs/${id}: ${response.status} ${JSON.stringify(response.body)}`)
    const run = response.body as RunBody
    return accept(run) ? run : undefined
  }, timeoutMs)
}

/** Waits for one of the finished statuses. */
export function waitForFinished(client: ApiClient, id: number, timeoutMs = 90_000): Promise<RunBody> {
  return waitForRun(client, id, run => ['succeeded', 'failed', 'cancelled'].includes(run.status), timeoutMs)
}
