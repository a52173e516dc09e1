/**
 * POST /api/calc/establishment, the computation — the genetics engine on the server:
 *
 * - `copies` (k copies introduced into a population of `census`): the engine directly —
 *   Kimura's diffusion `fixationProbability`, the exact Wright–Fisher chain
 *   `exactFixationProbability` where Ne = census ≤ 2000, Haldane's 2hs with the Ne/N factor
 *   `haldaneApproximation`, the branching-process survival 1 − (1 − π)^k, and
 *   `fixationMethodWarnings` (plus 'rule-of-thumb-only' when 2hs is outside its validity);
 * - `migrantsPerEvent` + `sourceFrequency` (one release of m animals into `census` residents):
 *   the proposal workspace's own computation, shared/proposals/establishment.ts
 *   `variantEstablishment` — copies J ~ Binomial(2m, q) start at j/(2(census + m)), drift at
 *   Ne; exact chain at round(Ne) ≤ 2000 — so an API user gets the figures the workspace shows
 *   for a single release.
 *
 * Engine RangeErrors (`<function>: <parameter> must be <constraint>, got <value>`) become 422
 * with an issue at the parameter (engineRangeErrorIssue).
 */
import {
  FIXATION_PROBABILITY_CAUTIONS, branchingSurvivalProbability, cautionsFor,
  fixationMethodWarnings, fixationProbability, haldaneApproximation, log10FixationProbability, type Caution, type CautionId,
} from '#shared/genetics'
import { variantEstablishment } from '#shared/proposals/establishment'
import type { CalcCautionDto, EstablishmentCalcResponse } from '#shared/schemas/scenario'
import { rememberedExactVector } from './exact-chain-memo'
import type { InputIssue } from './validate'

/** Largest census for which the calc route runs the exact chain (issue 6). */
export const CALC_EXACT_CENSUS_LIMIT = 2000

/** The parsed body of the route (EstablishmentCalcSchema output). */
export interface EstablishmentCalcRequest {
  census: number
  effectiveSize: number
  s: number
  h: number
  copies?: number
  migrantsPerEvent?: number
  sourceFrequency?: number
}

const finiteOrNull = (value: number): number | null => (Number.isFinite(value) ? value : null)

const cautionDto = (caution: Caution): CalcCautionDto => ({ id: caution.id, title: caution.title, text: caution.text, source: caution.source })

/**
 * `exactFixationProbability({ census, s, h, copies })` read off the remembered chain vector
 * (server/utils/exact-chain-memo.ts): the same numbers, computed once per (census, s, h).
 */
function exactFromVector(census: number, s: number, h: number, copies: number): number {
  if (copies === 0) return 0
  if (copies === 2 * census) return 1
  return rememberedExactVector({ census, s, h })?.[copies] ?? 0
}

/** Why the exact chain was or was not run, in words. */
function exactNote(census: number, effectiveSize: number): string {
  if (effectiveSize !== census) return `The exact chain needs Ne = census (here Ne = ${effectiveSize}, census = ${census}); the diffusion is the model value.`
  if (census > CALC_EXACT_CENSUS_LIMIT) return `The exact chain is run for census ≤ ${CALC_EXACT_CENSUS_LIMIT} (here ${census}); the diffusion is the model value.`
  return 'Exact Wright–Fisher chain with selection (Ne = census).'
}

/**
 * The figures for one request.
 *
 * @param input - census (integer ≥ 1), effectiveSize (> 0), s, h, and copies or migrantsPerEvent + sourceFrequency
 * @returns the response body
 * @throws RangeError from the engine when an input is outside its domain (the route answers 422)
 */
export function establishmentCalc(input: EstablishmentCalcRequest): EstablishmentCalcResponse {
  const { census, effectiveSize, s, h } = input
  const selection = { census, effectiveSize, s, h }
  const warnings = fixationMethodWarnings(selection) // validates census, Ne, s, h first
  const exactAllowed = effectiveSize === census && census <= CALC_EXACT_CENSUS_LIMIT
  const inputs = {
    census, effectiveSize, s, h,
    copies: input.copies ?? null, migrantsPerEvent: input.migrantsPerEvent ?? null, sourceFrequency: input.sourceFrequency ?? null,
  }
  const common = {
    exactNote: exactNote(census, effectiveSize),
    cautions: cautionsFor(FIXATION_PROBABILITY_CAUTIONS).map(cautionDto),
  }
  const pi = branchingSurvivalProbability({ s, h })

  if (input.copies !== undefined) {
    const copies = input.copies
    const probability = fixationProbability({ ...selection, copies })
    const haldane = copies >= 1 ? haldaneApproximation({ ...selection, copies }) : null
    const copiesWarnings: CautionId[] = haldane && !haldane.withinValidity ? [...warnings, 'rule-of-thumb-only'] : warnings
    return {
      inputs,
      copies: { mode: 'fixed', copies },
      diffusion: { probability, log10Probability: finiteOrNull(log10FixationProbability({ ...selection, copies })) },
      exact: exactAllowed ? { probability: exactFromVector(census, s, h, copies) } : null,
      haldane: haldane && {
        linear: haldane.linear,
        saturating: haldane.saturating,
        withinValidity: haldane.withinValidity,
        relativeErrorVsDiffusion: probability > 0 ? (haldane.saturating - probability) / probability : null,
      },
      branching: { probability: -Math.expm1(copies * Math.log1p(-pi)) },
      ...common,
      warnings: cautionsFor(copiesWarnings).map(cautionDto),
    }
  }

  // One release of m migrants into the census: the proposal workspace's computation
  // (shared/proposals/establishment.ts), so the API and the workspace always agree.
  const migrants = input.migrantsPerEvent ?? 0
  const q = input.sourceFrequency ?? 0
  const release = variantEstablishment({
    recipient: { census, effectiveSize, generationTimeYears: 1, initialInbreeding: 0 },
    schedule: { animalsPerEvent: migrants, females: migrants, males: 0, intervalYears: 1, events: 1, firstEventYear: 0 },
    variant: { name: 'variant', sourceFrequency: q, s, sRange: [s, s], h, hRange: [h, h] },
    index: 0,
    releaseYears: [0],
    horizonYears: 1,
    exactVector: rememberedExactVector,
    exactChainLimit: CALC_EXACT_CENSUS_LIMIT,
  })
  if (release.error !== null) throw new RangeError(release.error)
  const probability = release.diffusion.probability
  return {
    inputs,
    copies: { mode: 'binomial', distribution: release.copiesDistribution },
    diffusion: { probability, log10Probability: finiteOrNull(release.diffusion.log10Probability) },
    exact: release.exact.status === 'computed' ? { probability: release.exact.probability } : null,
    haldane: {
      linear: release.haldane.linear,
      saturating: release.haldane.probability,
      withinValidity: release.haldane.withinValidity,
      relativeErrorVsDiffusion: probability > 0 ? (release.haldane.probability - probability) / probability : null,
    },
    branching: { probability: release.branching.probability },
    ...common,
    exactNote: release.exact.status === 'computed'
      ? `Exact Wright–Fisher chain of round(Ne) = ${release.exact.chainSize} individuals started from the released copies (the workspace's method).`
      : release.exact.status === 'not-applicable' ? release.exact.reason : 'The exact chain was not computed.',
    warnings: cautionsFor(release.warnings).map(cautionDto),
  }
}

const ENGINE_MESSAGE = /^([A-Za-z]+): ([A-Za-z]+) must be (.*)$/s

/**
 * The 422 issue for an engine RangeError: the parameter as `path`, and the engine's words
 * ("s must be such that 1 + s > 0 (AA fitness positive), got -2.") as the message.
 *
 * @returns the issue, or null when the error is not an engine domain error
 * @example engineRangeErrorIssue(new RangeError('fixationProbability: copies must be at most 2·census = 20, got 25')) // { path: 'copies', message: 'copies must be at most 2·census = 20, got 25.' }
 */
export function engineRangeErrorIssue(error: unknown): InputIssue | null {
  if (!(error instanceof RangeError)) return null
  const match = ENGINE_MESSAGE.exec(error.message)
  if (!match) return null
  const [, , parameter = '', rest = ''] = match
  return { path: parameter, message: `${parameter} must be ${rest}.` }
}
