/**
 * Summaries from uploaded genotype data (SCIENCE.md §8): diversity per
 * population, allelic richness, private alleles, pairwise F_ST, plus the
 * validator and the CSV/VCF parsers shared by the browser preview and the
 * server. Diploid, co-dominant markers only.
 */
export type {
  Genotype,
  GenotypedIndividual,
  GenotypeDataset,
  GenotypeParseError,
  GenotypeParseResult,
  NamedGenotypeDataset,
} from './types'
export {
  MAX_LISTED_PROBLEMS,
  validateGenotypeDataset,
  type GenotypeDatasetProblem,
  type GenotypeDatasetValidation,
} from './validate-dataset'
export type { LocusDiversity } from './locus-diversity'
export { summarizeGenotypes, type GenotypeSummary, type MultilocusDiversity } from './summarize-genotypes'
export { privateAlleles, type PrivateAlleleList, type PrivateAlleleSummary } from './private-alleles'
export {
  allelicRichness,
  smallestGeneCount,
  type AllelicRichnessResult,
  type LocusAllelicRichness,
} from './allelic-richness'
export type { HudsonLocusFst } from './fst-hudson'
export type { WeirCockerhamLocusFst } from './fst-weir-cockerham'
export {
  pairwiseFst,
  type FstMethod,
  type FstOptions,
  type HudsonFstResult,
  type PairwiseFstResult,
  type SkippedFstLocus,
  type WeirCockerhamFstResult,
} from './pairwise-fst'
export { fstMatrix, type FstMatrix } from './fst-matrix'
export { MAX_PARSE_ERRORS } from './parse-errors'
export { parseGenotypeCsv, type GenotypeCsvOptions } from './parse-genotype-csv'
export { parseVcf } from './parse-vcf'
