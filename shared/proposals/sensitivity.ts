/**
 * How much the results move over the uncertain inputs: a one-at-a-time tornado over Ne, s, h
 * and the lethal equivalents (each across its plausible range, the others at their central
 * values), and a heat map of establishment probability over an s × Ne grid.
 *
 * Every value comes from `computeScenarioResults` / `scheduleEstablishment` with the diffusion
 * (the exact chain is left out: a sweep of many chains would be too slow, and SCIENCE.md §2.3
 * shows the diffusion within a few per cent for |s| < 0.1). One-at-a-time swings show which
 * input matters most; they do not show interactions — the heat map shows the largest one
 * (s with Ne) directly.
 *
 * Plausible ranges: s and h from the variant's own sRange / hRange, lethal equivalents from the
 * load's range, Ne from `defaultEffectiveSizeRange` unless given.
 */
import { NE_TO_CENSUS_RATIO_DEFAULT } from '../genetics'
import { scheduleEstablishment } from './establishment'
import { computeScenarioResults } from './results'
import { applyRecipientOverrides } from './recipient'
import { releasesBeforeHorizon, scheduleMovesAnimals } from './schedule'
import type { Range, RecipientFigures, ScenarioInputsLike } from './types'

/** The uncertain inputs of the tornado, in their display order before sorting. */
export type SensitivityInput = 'effectiveSize' | 's' | 'h' | 'lethalEquivalents'

/** The result a tornado describes. */
export type SensitivityMetric = 'establishment' | 'fitness'

export const SENSITIVITY_INPUT_LABELS: Readonly<Record<SensitivityInput, string>> = {
  effectiveSize: 'Effective size Ne',
  s: 'Selection coefficient s',
  h: 'Dominance h',
  lethalEquivalents: 'Lethal equivalents (2B)',
}

export const SENSITIVITY_METRIC_LABELS: Readonly<Record<SensitivityMetric, string>> = {
  establishment: 'Establishment probability',
  fitness: 'Relative fitness at the horizon, with the releases',
}

/** One bar of a tornado. */
export interface TornadoBar {
  input: SensitivityInput
  label: string
  /** The input's low and high ends. */
  lowInput: number
  highInput: number
  /** The result at the input's low and high ends. */
  lowValue: number
  highValue: number
  /** |highValue − lowValue|; 0 when the input does not affect this result. */
  swing: number
  /** False when the result does not depend on this input at all (e.g. lethal equivalents for establishment). */
  affects: boolean
}

export interface Tornado {
  metric: SensitivityMetric
  /** The result at the central values. */
  central: number
  /** Bars in decreasing swing; inputs that do not affect the result last. */
  bars: TornadoBar[]
  /** Name of the variant (establishment tornado), else null. */
  variantName: string | null
}

/**
 * The plausible range of Ne used by the sensitivity view when none is given: half to twice the
 * working value (Ne estimates are seldom better than a factor of 2), and, when Ne was only
 * derived from the census by the default ratio, the ratio range 0.05–0.3 × N of SCIENCE.md §5.
 *
 * @param effectiveSize - Ne in use
 * @param census - N
 * @param fromCensusRatio - true when Ne = 0.1 × N by default
 * @returns [low, high], low ≥ ½
 * @example defaultEffectiveSizeRange(40, 400, false)  // [20, 80]
 * @example defaultEffectiveSizeRange(40, 400, true)   // [20, 120]
 */
export function defaultEffectiveSizeRange(effectiveSize: number, census: number, fromCensusRatio = false): [number, number] {
  if (fromCensusRatio) {
    return [Math.max(0.5, NE_TO_CENSUS_RATIO_DEFAULT.low * census), Math.max(0.5, NE_TO_CENSUS_RATIO_DEFAULT.high * census)]
  }
  return [Math.max(0.5, effectiveSize / 2), effectiveSize * 2]
}

interface SensitivityInputs {
  recipient: RecipientFigures
  inputs: ScenarioInputsLike
  /** Ne range; default `defaultEffectiveSizeRange(Ne, N)`. */
  effectiveSizeRange?: Range
  /** Which variant the establishment results follow; default 0. */
  variantIndex?: number
}

function establishmentFor(recipient: RecipientFigures, inputs: ScenarioInputsLike, variantIndex: number, changes: { effectiveSize?: number, s?: number, h?: number }): number {
  const variant = inputs.variants[variantIndex]
  if (!variant || !scheduleMovesAnimals(inputs.schedule)) return 0
  const s = changes.s ?? variant.s
  const h = changes.h ?? variant.h
  if (!(1 + s > 0) || !(1 + h * s > 0)) return Number.NaN
  return scheduleEstablishment({
    census: recipient.census,
    effectiveSize: changes.effectiveSize ?? recipient.effectiveSize,
    s,
    h,
    animals: inputs.schedule.animalsPerEvent,
    sourceFrequency: variant.sourceFrequency,
    releases: releasesBeforeHorizon(inputs.schedule, inputs.horizonYears).length,
  })
}

function fitnessFor(recipient: RecipientFigures, inputs: ScenarioInputsLike, changes: { effectiveSize?: number, lethalEquivalents?: number }): number {
  const load = { ...inputs.load, diploidLethalEquivalents: changes.lethalEquivalents ?? inputs.load.diploidLethalEquivalents }
  const results = computeScenarioResults({
    recipient: { ...recipient, effectiveSize: changes.effectiveSize ?? recipient.effectiveSize },
    inputs: { ...inputs, variants: [], load, recipientOverrides: undefined },
  }, { exactVector: null })
  return results.projection.atHorizon.fitnessWith
}

function bar(input: SensitivityInput, range: Range, evaluate: (value: number) => number, affects: boolean): TornadoBar {
  const [lowInput, highInput] = range
  const lowValue = evaluate(lowInput)
  const highValue = evaluate(highInput)
  const swing = affects && Number.isFinite(lowValue) && Number.isFinite(highValue) ? Math.abs(highValue - lowValue) : 0
  return { input, label: SENSITIVITY_INPUT_LABELS[input], lowInput, highInput, lowValue, highValue, swing, affects }
}

/**
 * Sorts bars by decreasing swing, inputs without effect last (stable otherwise).
 *
 * @example sortTornadoBars([h 0.01, lethal no effect, s 0.2, Ne 0.05]).map(bar => bar.input)  // ['s', 'effectiveSize', 'h', 'lethalEquivalents']
 */
export function sortTornadoBars(bars: readonly TornadoBar[]): TornadoBar[] {
  return [...bars].sort((a, b) => Number(b.affects) - Number(a.affects) || b.swing - a.swing)
}

/**
 * One-at-a-time tornado of a result over Ne, s, h and the lethal equivalents.
 *
 * @param metric - 'establishment' (probability that the chosen variant establishes; depends on
 *   Ne, s, h) or 'fitness' (relative fitness at the horizon with the releases; depends on Ne
 *   and the lethal equivalents)
 * @param args - recipient figures, scenario inputs, optional Ne range and variant index
 * @returns the central value and the bars, largest swing first
 * @example tornado('establishment', { recipient: { census: 150, effectiveSize: 40, generationTimeYears: 3, initialInbreeding: 0 },
 *   inputs: { schedule: 4 animals × 3 releases, variants: [{ q: 1, s: 0.1 (0.05–0.2), h: 0.5 (0.25–0.75) }], … } }).bars
 *   // Ne 20–80: 0.2723 → 0.7126; s 0.05–0.2: the same (u depends on Ne·s only); h: 0.3418 → 0.5795;
 *   // lethal equivalents: no effect (listed last)
 */
export function tornado(metric: SensitivityMetric, args: SensitivityInputs): Tornado {
  const recipient = applyRecipientOverrides(args.recipient, args.inputs.recipientOverrides)
  const { inputs } = args
  const variantIndex = args.variantIndex ?? 0
  const variant = inputs.variants[variantIndex]
  const neRange = args.effectiveSizeRange ?? defaultEffectiveSizeRange(recipient.effectiveSize, recipient.census)
  const sRange: Range = variant?.sRange ?? [0, 0]
  const hRange: Range = variant?.hRange ?? [0, 0]
  const loadRange = inputs.load.range
  const central = metric === 'establishment'
    ? establishmentFor(recipient, inputs, variantIndex, {})
    : fitnessFor(recipient, inputs, {})
  const bars = metric === 'establishment'
    ? [
        bar('effectiveSize', neRange, value => establishmentFor(recipient, inputs, variantIndex, { effectiveSize: value }), Boolean(variant)),
        bar('s', sRange, value => establishmentFor(recipient, inputs, variantIndex, { s: value }), Boolean(variant)),
        bar('h', hRange, value => establishmentFor(recipient, inputs, variantIndex, { h: value }), Boolean(variant)),
        bar('lethalEquivalents', loadRange, () => central, false),
      ]
    : [
        bar('effectiveSize', neRange, value => fitnessFor(recipient, inputs, { effectiveSize: value }), true),
        bar('s', sRange, () => central, false),
        bar('h', hRange, () => central, false),
        bar('lethalEquivalents', loadRange, value => fitnessFor(recipient, inputs, { lethalEquivalents: value }), true),
      ]
  return { metric, central, bars: sortTornadoBars(bars), variantName: metric === 'establishment' ? variant?.name ?? null : null }
}

/** Heat map of establishment probability over s × Ne. */
export interface EstablishmentHeatmap {
  /** s values (columns), increasing. */
  s: number[]
  /** Ne values (rows), increasing, log-spaced. */
  effectiveSize: number[]
  /** values[row][column] = probability at (Ne[row], s[column]); NaN where 1 + h·s ≤ 0. */
  values: number[][]
  /** The central (s, Ne) of the scenario, to mark on the map. */
  central: { s: number, effectiveSize: number }
  variantName: string | null
}

/**
 * Establishment probability of one variant over a grid of s (linear over the variant's s
 * range, or s/2 – 2s when the range is a single value) and Ne (logarithmic over the Ne range).
 *
 * @param args - recipient figures, scenario inputs, optional Ne range and variant index
 * @param steps - grid size: columns for s and rows for Ne (each ≥ 2); default 11 × 9
 * @returns the grid; every value 0 when the scenario moves no animals or has no variant
 * @example establishmentHeatmap({ recipient, inputs }, { s: 5, effectiveSize: 3 }).s  // [0.01, 0.0575, 0.105, 0.1525, 0.2] for s range 0.01–0.2
 */
export function establishmentHeatmap(args: SensitivityInputs, steps: { s?: number, effectiveSize?: number } = {}): EstablishmentHeatmap {
  const recipient = applyRecipientOverrides(args.recipient, args.inputs.recipientOverrides)
  const variantIndex = args.variantIndex ?? 0
  const variant = args.inputs.variants[variantIndex]
  const sColumns = Math.max(2, steps.s ?? 11)
  const neRows = Math.max(2, steps.effectiveSize ?? 9)
  const centralS = variant?.s ?? 0
  let [sLow, sHigh] = variant?.sRange ?? [0, 0]
  if (sLow === sHigh) [sLow, sHigh] = centralS === 0 ? [-0.01, 0.01] : [Math.min(centralS / 2, centralS * 2), Math.max(centralS / 2, centralS * 2)]
  const [neLow, neHigh] = args.effectiveSizeRange ?? defaultEffectiveSizeRange(recipient.effectiveSize, recipient.census)
  const s = Array.from({ length: sColumns }, (_, index) => sLow + (sHigh - sLow) * index / (sColumns - 1))
  const effectiveSize = Array.from({ length: neRows }, (_, index) => neLow * (neHigh / neLow) ** (index / (neRows - 1)))
  const values = effectiveSize.map(ne => s.map(sValue => establishmentFor(recipient, args.inputs, variantIndex, { effectiveSize: ne, s: sValue })))
  return { s, effectiveSize, values, central: { s: centralS, effectiveSize: recipient.effectiveSize }, variantName: variant?.name ?? null }
}
