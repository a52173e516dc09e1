/**
 * Which scenarios a brief talks about first: the recommended one (or, when none was chosen, the
 * first scenario that moves animals) and the "No action" baseline it is compared with.
 */
import type { BriefData, BriefScenario } from '../types'

/** The recommended scenario, else the first with animals moved, else null. */
export function recommendedScenario(data: Pick<BriefData, 'scenarios'>): BriefScenario | null {
  return data.scenarios.find(scenario => scenario.recommended)
    ?? data.scenarios.find(scenario => !scenario.isBaseline)
    ?? null
}

/** The baseline ("No action") scenario, if the proposal has one. */
export function baselineScenario(data: Pick<BriefData, 'scenarios'>): BriefScenario | null {
  return data.scenarios.find(scenario => scenario.isBaseline) ?? null
}

/** The caution every brief carries, word for word (cover and final page). */
export const GOVERNING_CAUTION = 'This brief supports a decision; it does not authorise one. Agency policy, permits and licensed practice govern any translocation, capture, handling or release of animals.'

/** The header and watermark words of a preview. */
export const DRAFT_MARK = 'Draft — not approved'
