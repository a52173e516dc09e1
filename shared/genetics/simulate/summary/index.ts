/** Summaries over replicates: quantile bands, means and interval estimates. */
export { quantileOfSorted, quantilesOf, quantileOfHistogram, orderIndependentMean, QUANTILE_PROBABILITIES } from './quantiles'
export type { Quantiles } from './quantiles'
export { wilsonInterval, NORMAL_QUANTILE_975 } from './wilson-interval'
