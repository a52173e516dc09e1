/**
 * Outbreeding-depression risk screen (SCIENCE.md §7, Frankham et al. 2011).
 * Re-exported from shared/genetics/index.ts.
 */
export { outbreedingRisk } from './outbreeding-risk'
export type { OutbreedingQuestion, OutbreedingRiskResult, ScreenAnswer } from './outbreeding-risk'
