/**
 * Establishment of one adaptive variant under a release schedule.
 *
 * One release of k animals from a source where the variant has frequency q carries
 * J ~ Binomial(2k, q) copies (shared/proposals/copies.ts). The released animals join the N
 * residents, so j copies start at p = j / (2(N + k)) while drift acts at the recipient's Ne
 * (Kimura's treatment: census sets the start, Ne the drift — SCIENCE.md §1.1; the same model as
 * the stochastic simulation). The probability that the release establishes the variant is
 *
 *     P₁ = Σ_j P(J = j)·u(j)                                     (stated, exact for the model)
 *
 * with u(j) the engine's diffusion fixation probability (Kimura 1962). For R releases before
 * the horizon we use the **approximation** P = 1 − (1 − P₁)^R: releases are treated as
 * independent trials, each into a population where the variant is absent. It ignores that a
 * later release may meet copies of an earlier one still drifting (which helps a little), that
 * the census grows with each release, and any release after the variant fixed. The stochastic
 * simulation handles schedules exactly.
 *
 * Beside it: the exact Wright–Fisher chain at M = round(Ne) (exact-start.ts) when M ≤ 2000,
 * Haldane's 2hs with Kimura's Ne/N factor, and the branching-process value — each mixed over
 * the same copies distribution (for the last two by the binomial generating function
 * E[1 − (1 − x)^J] = 1 − (1 − q·x)^(2k)).
 */
import {
  branchingSurvivalProbability,
  fixationMethodWarnings,
  haldaneApproximation,
  log10FixationProbability,
} from '../genetics'
import type { CautionId } from '../genetics'
import { combineReleases, copiesDistribution, logMixture } from './copies'
import { EXACT_CHAIN_LIMIT, logExactFromFrequency } from './exact-start'
import type { ExactVectorProvider } from './exact-start'
import { timeToEstablishment } from './time-to-establishment'
import type { ExactEstablishment, RecipientFigures, ScheduleLike, VariantEstablishment, VariantLike } from './types'

/** Inputs of `variantEstablishment`. */
export interface VariantEstablishmentInput {
  recipient: RecipientFigures
  /** A schedule that moves animals (see `scheduleMovesAnimals`). */
  schedule: ScheduleLike
  variant: VariantLike
  index: number
  /** Years of the releases before the horizon. */
  releaseYears: readonly number[]
  horizonYears: number
  /** Where the exact chain's vector comes from; null skips the exact chain. */
  exactVector: ExactVectorProvider | null
  /** Largest round(Ne) for the exact chain; default EXACT_CHAIN_LIMIT. */
  exactChainLimit?: number
}

/**
 * ln P₁, the diffusion establishment probability of one release.
 *
 * @param census - N, recipient census before the release, integer ≥ 1
 * @param effectiveSize - Ne, ≥ ½
 * @param s - AA selection coefficient, 1 + s > 0
 * @param h - dominance, 1 + h·s > 0
 * @param animals - k, animals per release, integer ≥ 1
 * @param sourceFrequency - q, in (0, 1]
 * @returns ln Σ_j P(J = j)·u(j) and the mixture terms (copy number, ln P(j)·u(j))
 * @throws RangeError from the engine when an input is outside its domain
 * @example Math.exp(singleReleaseDiffusion({ census: 100, effectiveSize: 100, s: 0.01, h: 0.5, animals: 1, sourceFrequency: 0.5 }).logSum)
 *   // 0.011366105638649818
 */
export function singleReleaseDiffusion(args: { census: number, effectiveSize: number, s: number, h: number, animals: number, sourceFrequency: number }) {
  const postCensus = args.census + args.animals
  return logMixture(2 * args.animals, args.sourceFrequency, copies =>
    log10FixationProbability({ census: postCensus, effectiveSize: args.effectiveSize, s: args.s, h: args.h, copies }) * Math.LN10)
}

/**
 * Diffusion establishment probability over all releases counted, P = 1 − (1 − P₁)^R.
 *
 * @param census - N, recipient census before the release
 * @param effectiveSize - Ne
 * @param s - AA selection coefficient
 * @param h - dominance
 * @param animals - k, animals per release, ≥ 1
 * @param sourceFrequency - q, in (0, 1]
 * @param releases - R, releases counted, ≥ 0
 * @returns P, in [0, 1]
 * @example scheduleEstablishment({ census: 100, effectiveSize: 100, s: 0.01, h: 0.5, animals: 1, sourceFrequency: 0.5, releases: 1 })
 *   // 0.011366105638649818 (= 0.5·u(1) + 0.25·u(2) at census 101)
 * @example scheduleEstablishment({ …same, releases: 0 })  // 0
 */
export function scheduleEstablishment(args: { census: number, effectiveSize: number, s: number, h: number, animals: number, sourceFrequency: number, releases: number }): number {
  if (args.releases <= 0) return 0
  return combineReleases(Math.exp(singleReleaseDiffusion(args).logSum), args.releases)
}

function exactPart(input: VariantEstablishmentInput, postCensus: number, diffusionAll: number): ExactEstablishment {
  const { variant, recipient, schedule } = input
  const limit = input.exactChainLimit ?? EXACT_CHAIN_LIMIT
  const chainSize = Math.max(1, Math.round(recipient.effectiveSize))
  if (!input.exactVector) return { status: 'not-applicable', reason: 'The exact chain was not requested here.' }
  if (chainSize > limit) {
    return {
      status: 'not-applicable',
      reason: `Ne ≈ ${chainSize} is above ${limit}: the exact chain is too slow to run here, and the diffusion is accurate at this size for the s values that matter (SCIENCE.md §2.3).`,
    }
  }
  const vector = input.exactVector({ census: chainSize, s: variant.s, h: variant.h })
  if (!vector) return { status: 'pending', chainSize }
  const single = Math.exp(logMixture(2 * schedule.animalsPerEvent, variant.sourceFrequency, copies =>
    logExactFromFrequency(vector, copies / (2 * postCensus), variant.s, variant.h)).logSum)
  const probability = combineReleases(single, input.releaseYears.length)
  return {
    status: 'computed',
    probability,
    singleRelease: single,
    chainSize,
    diffusionRelativeDifference: probability > 0 ? (diffusionAll - probability) / probability : null,
  }
}

/**
 * The corners of the s × h ranges to evaluate. With h in [0, 1] establishment rises with s
 * (both the AA and Aa fitness rise) and, for s of one sign, moves with h in the direction of
 * that sign; then only the two extreme corners are needed. Otherwise all four.
 */
function rangeCorners(sRange: readonly [number, number], hRange: readonly [number, number]): [number, number][] {
  const [sLow, sHigh] = sRange
  const [hLow, hHigh] = hRange
  const dominanceInUnitRange = hLow >= 0 && hHigh <= 1
  if (dominanceInUnitRange && sLow >= 0) return [[sLow, hLow], [sHigh, hHigh]]
  if (dominanceInUnitRange && sHigh <= 0) return [[sLow, hHigh], [sHigh, hLow]]
  return [[sLow, hLow], [sLow, hHigh], [sHigh, hLow], [sHigh, hHigh]]
}

/** Diffusion over the releases at the corners of the s and h ranges (and the central value). */
function plausibleRange(input: VariantEstablishmentInput, central: number): { low: number, high: number } {
  const { variant, recipient, schedule } = input
  let low = central
  let high = central
  for (const [s, h] of rangeCorners(variant.sRange, variant.hRange)) {
    if (!(1 + s > 0) || !(1 + h * s > 0)) continue
    const value = scheduleEstablishment({
      census: recipient.census, effectiveSize: recipient.effectiveSize, s, h,
      animals: schedule.animalsPerEvent, sourceFrequency: variant.sourceFrequency, releases: input.releaseYears.length,
    })
    low = Math.min(low, value)
    high = Math.max(high, value)
  }
  return { low, high }
}

/** An all-zero result for a variant whose inputs the engine refuses. */
function failed(input: VariantEstablishmentInput, message: string): VariantEstablishment {
  return {
    name: input.variant.name,
    index: input.index,
    error: message,
    diffusion: { probability: 0, singleRelease: 0, log10Probability: Number.NEGATIVE_INFINITY },
    exact: { status: 'not-applicable', reason: message },
    headline: { probability: 0, method: 'diffusion' },
    range: { low: 0, high: 0 },
    haldane: { probability: 0, linear: 0, relativeError: null, withinValidity: false },
    branching: { probability: 0 },
    copiesDistribution: copiesDistribution(input.schedule.animalsPerEvent, Math.min(1, Math.max(Number.MIN_VALUE, input.variant.sourceFrequency || Number.MIN_VALUE))),
    releasesCounted: input.releaseYears.length,
    warnings: [],
    time: null,
  }
}

/**
 * Every establishment figure for one variant under one schedule.
 *
 * @param input - see VariantEstablishmentInput
 * @returns the figures; `error` is set (and the figures are 0) when an input is outside the
 *   engine's domain, instead of throwing, so one bad variant does not blank the page
 * @example variantEstablishment({ recipient: { census: 99, effectiveSize: 100, generationTimeYears: 2, initialInbreeding: 0 },
 *   schedule: { animalsPerEvent: 1, females: 1, males: 0, intervalYears: 5, events: 1 },
 *   variant: { name: 'v', sourceFrequency: 1, s: 0.1, sRange: [0.05, 0.2], h: 0.5, hRange: [0.25, 0.75] },
 *   index: 0, releaseYears: [0], horizonYears: 20, exactVector: computeExactVector }).diffusion.probability
 *   // 0.18126924729564187 (exact chain 0.17803233000515664)
 * @example (same with s: 0.5, h: -3).error
 *   // 'log10FixationProbability: h must be such that 1 + h·s > 0 (Aa fitness positive; s = 0.5), got -3'
 */
export function variantEstablishment(input: VariantEstablishmentInput): VariantEstablishment {
  try {
    return computeVariant(input)
  } catch (error) {
    if (error instanceof RangeError) return failed(input, error.message)
    throw error
  }
}

function computeVariant(input: VariantEstablishmentInput): VariantEstablishment {
  const { recipient, schedule, variant } = input
  const { census, effectiveSize } = recipient
  const { s, h, sourceFrequency } = variant
  const animals = schedule.animalsPerEvent
  const releases = input.releaseYears.length
  const postCensus = census + animals
  const geneCopies = 2 * animals

  const mixture = singleReleaseDiffusion({ census, effectiveSize, s, h, animals, sourceFrequency })
  const singleRelease = Math.exp(mixture.logSum)
  const diffusionAll = combineReleases(singleRelease, releases)
  // log10 of 1 − (1 − P₁)^R stays finite when P₁ underflows: ≈ log10 R + log10 P₁.
  const log10Probability = releases === 0
    ? Number.NEGATIVE_INFINITY
    : diffusionAll > 0 ? Math.log10(diffusionAll) : Math.log10(releases) + mixture.logSum / Math.LN10

  const exact = exactPart(input, postCensus, diffusionAll)
  const headline = releases === 0
    ? { probability: 0, method: 'no-release' as const }
    : exact.status === 'computed'
      ? { probability: exact.probability, method: 'exact' as const }
      : { probability: diffusionAll, method: 'diffusion' as const }

  const rule = haldaneApproximation({ census: postCensus, effectiveSize, s, h, copies: 1 })
  const perCopy = rule.linear > 0 ? -Math.expm1(-rule.linear) : 0
  const haldaneSingle = perCopy > 0 ? -Math.expm1(geneCopies * Math.log1p(-sourceFrequency * perCopy)) : 0
  const haldaneAll = combineReleases(haldaneSingle, releases)
  const branchingPerCopy = branchingSurvivalProbability({ s, h })
  const branchingSingle = branchingPerCopy > 0 ? -Math.expm1(geneCopies * Math.log1p(-sourceFrequency * branchingPerCopy)) : 0

  const warnings: CautionId[] = fixationMethodWarnings({ census, effectiveSize, s, h })
  if (!rule.withinValidity) warnings.push('rule-of-thumb-only')

  return {
    name: variant.name,
    index: input.index,
    error: null,
    diffusion: { probability: diffusionAll, singleRelease, log10Probability },
    exact,
    headline,
    range: plausibleRange(input, diffusionAll),
    haldane: {
      probability: haldaneAll,
      linear: Math.max(0, rule.linear) * geneCopies * sourceFrequency * releases,
      relativeError: headline.probability > 0 ? (haldaneAll - headline.probability) / headline.probability : null,
      withinValidity: rule.withinValidity,
    },
    branching: { probability: combineReleases(branchingSingle, releases) },
    copiesDistribution: copiesDistribution(animals, sourceFrequency),
    releasesCounted: releases,
    warnings,
    time: releases === 0 || singleRelease <= 0
      ? null
      : timeToEstablishment({
          terms: mixture.terms,
          census: postCensus,
          effectiveSize,
          s,
          h,
          singleRelease,
          releaseYears: input.releaseYears,
          generationTimeYears: recipient.generationTimeYears,
          horizonYears: input.horizonYears,
        }),
  }
}
