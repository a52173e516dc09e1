/**
 * Proposal results as pure functions: the workspace computes them in the browser on every
 * input change, the server's calc route and the PDF brief call the same code. Import from
 * '#shared/proposals'. No Vue, Nitro or database imports anywhere under this folder.
 */
export * from './types'
export { computeScenarioResults, computeExactVector } from './results'
export type { ScenarioResultsOptions, ExactVectorProvider } from './results'
export { EXACT_CHAIN_LIMIT, selectedFrequency, logExactFromFrequency } from './exact-start'
export { binomialLogProbability, combineReleases, copiesDistribution, logMixture, MIXTURE_TOLERANCE } from './copies'
export type { LogMixture, MixtureTerm } from './copies'
export { scheduleEstablishment, singleReleaseDiffusion, variantEstablishment } from './establishment'
export { timeToEstablishment, TIME_TERMS_LIMIT } from './time-to-establishment'
export { projectScenario, releaseSteps } from './projection'
export { migrantsSummary, oneMigrantRuleCheck } from './migrants'
export { applyRecipientOverrides, resolveRecipient } from './recipient'
export type { FigureSource, RecipientRecord, ResolvedRecipient } from './recipient'
export { releaseYears, releasesBeforeHorizon, scheduleMovesAnimals } from './schedule'
export {
  defaultEffectiveSizeRange,
  establishmentHeatmap,
  SENSITIVITY_INPUT_LABELS,
  SENSITIVITY_METRIC_LABELS,
  sortTornadoBars,
  tornado,
} from './sensitivity'
export type { EstablishmentHeatmap, SensitivityInput, SensitivityMetric, Tornado, TornadoBar } from './sensitivity'
export { DECISION_SUPPORT_STATEMENT, EXPLANATION_IDS, EXPLANATIONS, isExplanationId } from './explanations'
export type { Explanation, ExplanationId } from './explanations'
export { formatNumber, formatProbability, formatRelative, formatYears, oneIn } from './format'
export { scenarioKeyFigures } from './key-figures'
export type { KeyFigure } from './key-figures'
