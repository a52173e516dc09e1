/**
 * Effective-size estimate and working-Ne → JSON (shapes in shared/schemas/effective-size.ts).
 *
 * The working Ne links to an estimate only while their values agree: if the value was changed
 * elsewhere (e.g. PATCH /api/subpopulations/:id), the link is not reported.
 */
import type { EffectiveSizeEstimate, Subpopulation, User } from '../db/models'
import { effectiveSizeMethodLabel, type EffectiveSizeEstimateDto, type RecordActorDto, type WorkingNeDto } from '#shared/schemas/effective-size'

const finiteOrNull = (value: number | null | undefined): number | null =>
  typeof value === 'number' && Number.isFinite(value) ? value : null

function actor(user: Pick<User, 'id' | 'name'> | null | undefined): RecordActorDto | null {
  return user ? { id: user.id, name: user.name } : null
}

/** True when two Ne values are the same figure (stored doubles may differ in the last bits). */
export function sameEffectiveSize(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b))
}

/** The estimate id the working Ne comes from, when the link still holds. */
export function linkedWorkingEstimateId(subpopulation: Subpopulation, estimates: readonly EffectiveSizeEstimate[]): number | null {
  const id = subpopulation.workingNeEstimateId ?? null
  if (id === null || subpopulation.workingNe === null || subpopulation.workingNe === undefined) return null
  const estimate = estimates.find(candidate => candidate.id === id)
  return estimate && sameEffectiveSize(estimate.value, subpopulation.workingNe) ? id : null
}

export function effectiveSizeEstimateDto(
  estimate: EffectiveSizeEstimate & { creator?: Pick<User, 'id' | 'name'> | null },
  workingEstimateId: number | null,
): EffectiveSizeEstimateDto {
  return {
    id: estimate.id,
    subpopulationId: estimate.subpopulationId,
    method: estimate.method,
    methodLabel: effectiveSizeMethodLabel(estimate.method),
    inputs: estimate.inputs ?? {},
    value: estimate.value,
    intervalLow: finiteOrNull(estimate.intervalLow),
    intervalHigh: finiteOrNull(estimate.intervalHigh),
    estimatedOn: estimate.estimatedOn ?? null,
    source: estimate.source,
    createdBy: actor(estimate.creator),
    createdAt: new Date(estimate.createdAt).toISOString(),
    isWorking: workingEstimateId === estimate.id,
  }
}

export function workingNeDto(
  subpopulation: Subpopulation,
  workingEstimateId: number | null,
  setBy: Pick<User, 'id' | 'name'> | null,
): WorkingNeDto {
  return {
    value: finiteOrNull(subpopulation.workingNe),
    reason: subpopulation.workingNeReason ?? null,
    estimateId: workingEstimateId,
    setBy: actor(setBy),
    setAt: subpopulation.workingNeSetAt ? new Date(subpopulation.workingNeSetAt).toISOString() : null,
    version: subpopulation.version,
  }
}
