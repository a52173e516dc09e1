/**
 * Genotype uploads and the genetic profile of a subpopulation: the one list of accepted file
 * types and limits, the zod schemas of the upload form and the F_ST query (used by the routes
 * under server/api/subpopulations/[id]/genotypes*, server/api/genotypes/*,
 * server/api/species/[id]/fst.get.ts and by components/genetics/*), the answer shapes (DTOs),
 * the CSV template offered for download, and the method notes shown beside each number.
 */
import { z } from 'zod'
import { MARKER_TYPES, type GeneticDatasetFormat, type MarkerType } from '../types/db'

/** Largest genotype file accepted (bytes). Parsing needs the text in memory, so keep it modest. */
export const GENOTYPE_FILE_MAX_BYTES = 10 * 1024 * 1024

/** File-name endings accepted for genotype files, and the format each is read as. */
export const GENOTYPE_FILE_EXTENSIONS: Readonly<Record<string, GeneticDatasetFormat>> = {
  '.csv': 'csv',
  '.tsv': 'csv',
  '.txt': 'csv',
  '.vcf': 'vcf',
}

/** The format a genotype file is read as, from its name; null when the ending is not accepted. */
export function genotypeFormatOf(fileName: string): GeneticDatasetFormat | null {
  const match = /\.[^.]+$/.exec(fileName.toLowerCase())
  return match ? GENOTYPE_FILE_EXTENSIONS[match[0]] ?? null : null
}

/** Words for a marker type. */
export const MARKER_TYPE_LABELS: Readonly<Record<MarkerType, string>> = {
  microsatellite: 'Microsatellites',
  snp: 'SNPs',
}

const optionalYear = z.preprocess(
  value => (typeof value === 'string' && value.trim() === '' ? undefined : value),
  z.coerce.number({ error: 'Enter a year, like 2024.' })
    .int('Enter a whole year, like 2024.')
    .min(1800, 'Enter a year from 1800 on.')
    .max(2200, 'Enter a year before 2200.')
    .optional(),
)

/** The text fields sent with a genotype file (multipart form fields, so all strings). */
export const GenotypeUploadFieldsSchema = z.object({
  markerType: z.enum(MARKER_TYPES, { error: 'Choose the marker type: microsatellites or SNPs.' }),
  sampledYear: optionalYear,
})
export type GenotypeUploadFields = z.output<typeof GenotypeUploadFieldsSchema>

/** F_ST estimators offered (the engine's `FstMethod`). */
export const FST_METHODS = ['hudson', 'weir-cockerham'] as const
export type FstMethodName = typeof FST_METHODS[number]

/** Query of GET /api/species/:id/fst. */
export const FstQuerySchema = z.object({
  method: z.enum(FST_METHODS, { error: 'Choose "hudson" or "weir-cockerham".' }).default('hudson'),
  markerType: z.enum(MARKER_TYPES, { error: 'Choose "microsatellite" or "snp".' }).optional(),
})
export type FstQuery = z.output<typeof FstQuerySchema>

/** Who uploaded something, as lists show it. */
export interface PersonRef { id: number, name: string }

/** Headline diversity of one dataset (multi-locus means; SCIENCE.md §8.1). */
export interface GeneticDiversityOverview {
  individualCount: number
  genotypedIndividualCount: number
  locusCount: number
  /** loci averaged in the means */
  lociInMeans: number
  monomorphicLoci: number
  lociWithoutData: string[]
  missingGenotypeFraction: number
  meanSampleSize: number | null
  meanAlleleCount: number | null
  observedHeterozygosity: number | null
  /** Nei (1978) unbiased He */
  expectedHeterozygosity: number | null
  /** multi-locus F_IS = 1 − mean(Ho)/mean(He) */
  inbreedingCoefficient: number | null
  includesMonomorphicLoci: boolean
}

/** Allelic richness of a dataset, rarefied to the comparison's smallest sample, or why there is none. */
export type AllelicRichnessOverview
  = | {
    available: true
    /** g, gene copies every dataset in the comparison is rarefied to */
    rarefactionSize: number
    /** the dataset and locus with the fewest gene copies, which set g */
    limitedBy: { subpopulationName: string, locus: string }
    meanRichness: number
    meanAlleleCount: number
  }
  | { available: false, reason: string }

/** Private alleles of a dataset against the other subpopulations of the species, or why there are none. */
export type PrivateAllelesOverview
  = | {
    available: true
    count: number
    sharedLocusCount: number
    skippedLoci: string[]
    comparedWith: string[]
  }
  | { available: false, reason: string }

/** One genotype dataset as lists show it. */
export interface GeneticDatasetDto {
  id: number
  subpopulationId: number
  fileName: string
  format: GeneticDatasetFormat
  markerType: MarkerType
  sampledYear: number | null
  sizeBytes: number
  checksumSha256: string
  createdAt: string
  createdBy: PersonRef | null
  version: number
  /** true for the dataset this subpopulation contributes to species comparisons (F_ST, private alleles) */
  current: boolean
  diversity: GeneticDiversityOverview
  allelicRichness: AllelicRichnessOverview
  privateAlleles: PrivateAllelesOverview
  /** datasets of other subpopulations used for richness and private alleles */
  comparedWith: { datasetId: number, subpopulationId: number, subpopulationName: string }[]
  /** subpopulations with a dataset of the same marker type but no locus in common (not compared) */
  withoutSharedLoci: string[]
  canDelete: boolean
}

/** Per-locus detail of one dataset. */
export interface GeneticLocusRow {
  locus: string
  sampleSize: number
  alleleCount: number
  alleleCounts: { allele: string, count: number }[]
  observedHeterozygosity: number | null
  expectedHeterozygosity: number | null
  inbreedingCoefficient: number | null
  monomorphic: boolean
  /** rarefied richness A(g) at this locus; null when richness is not available */
  allelicRichness: number | null
  /** alleles found only in this subpopulation (null when not compared) */
  privateAlleles: string[] | null
}

/** GET /api/genotypes/:id */
export interface GeneticDatasetDetailDto extends GeneticDatasetDto {
  loci: GeneticLocusRow[]
  /** true when the private-allele list was cut short (count stays exact) */
  privateAlleleListTruncated: boolean
}

/** GET /api/subpopulations/:id/genotypes */
export interface GeneticDatasetListResponse {
  subpopulation: { id: number, name: string, speciesId: number }
  items: GeneticDatasetDto[]
  canUpload: boolean
  limits: { maxBytes: number, extensions: string[] }
}

/** GET /api/species/:id/fst */
export interface FstMatrixResponse {
  speciesId: number
  method: FstMethodName
  markerType: MarkerType | null
  /** marker types with at least one dataset in the species, and how many subpopulations have one */
  markerTypes: { markerType: MarkerType, subpopulations: number }[]
  populations: { subpopulationId: number, name: string, datasetId: number, fileName: string, sampledYear: number | null, individualCount: number }[]
  /** symmetric; diagonal 0 by definition; null where no locus carries information */
  values: (number | null)[][]
  /** loci both datasets name, per pair (diagonal: the dataset's own loci) */
  sharedLoci: number[][]
  /** subpopulations with a dataset of this marker type that shares no locus with any other (left out) */
  notCompared: { subpopulationId: number, name: string, datasetId: number }[]
}

/** A downloadable template and worked example of the genotype CSV format (invented animals). */
export const GENOTYPE_CSV_TEMPLATE = [
  'id,Loc1_1,Loc1_2,Loc2_1,Loc2_2,Loc3_1,Loc3_2',
  'EX01,101,103,200,200,150,154',
  'EX02,101,101,200,210,150,150',
  'EX03,103,105,0,0,154,158',
  'EX04,101,103,210,210,NA,NA',
  '',
].join('\n')

/** How a number on the genetic profile is computed, and where the method comes from. */
export interface GeneticMethodNote {
  title: string
  text: string
  formula?: string
  citation: string
}

/** Method notes, keyed by the figure they explain (one click away from each number). */
export const GENETIC_METHOD_NOTES = {
  'sampleSize': {
    title: 'Sample size',
    text: 'Individuals in the file, and the mean number genotyped per locus. Each locus uses only the individuals genotyped there; missing genotypes are left out, not counted as homozygous.',
    citation: 'Standard practice (SCIENCE.md §8).',
  },
  'observedHeterozygosity': {
    title: 'Observed heterozygosity (Ho)',
    text: 'The share of genotyped individuals carrying two different alleles, averaged over loci.',
    formula: 'Ho = heterozygous individuals / n',
    citation: 'Nei, M. (1987). Molecular Evolutionary Genetics. Columbia University Press.',
  },
  'expectedHeterozygosity': {
    title: 'Expected heterozygosity (He, unbiased)',
    text: 'Gene diversity corrected for small samples (Nei 1978): the chance that two gene copies drawn from the sample differ. Averaged over loci, monomorphic loci included.',
    formula: 'He = 2n/(2n − 1) · (1 − Σ pᵢ²)',
    citation: 'Nei, M. (1978). Estimation of average heterozygosity and genetic distance from a small number of individuals. Genetics 89: 583–590.',
  },
  'inbreedingCoefficient': {
    title: 'Inbreeding coefficient (F_IS)',
    text: 'How far heterozygosity falls short of random-mating expectation. Multi-locus value is a ratio of means, not a mean of ratios. Positive: fewer heterozygotes than expected (inbreeding, hidden structure or null alleles).',
    formula: 'F_IS = 1 − mean(Ho) / mean(He)',
    citation: 'Nei, M. (1978). Genetics 89: 583–590 (He); SCIENCE.md §8.1.',
  },
  'allelicRichness': {
    title: 'Allelic richness (rarefied)',
    text: 'The expected number of alleles per locus in a subsample of g gene copies, so that samples of different size can be compared. g is the smallest number of gene copies at any locus among this dataset and the current datasets of the other subpopulations of the species with the same marker type; every one of them is rarefied to the same g.',
    formula: 'A(g) = Σᵢ [1 − C(2n − Nᵢ, g) / C(2n, g)]',
    citation: 'Hurlbert, S. H. (1971). Ecology 52: 577–586; El Mousadik, A., Petit, R. J. (1996). Theoretical and Applied Genetics 92: 832–839.',
  },
  'privateAlleles': {
    title: 'Private alleles',
    text: 'Alleles seen in this subpopulation and in none of the other subpopulations of the species (their current dataset of the same marker type), counted over the loci every one of them has genotyped. Larger samples find more rare alleles, so compare samples of similar size.',
    citation: 'Slatkin, M. (1985). Rare alleles as indicators of gene flow. Evolution 39: 53–65.',
  },
  'hudson': {
    title: 'F_ST, Hudson estimator',
    text: 'Differentiation between two subpopulations from the chance that two gene copies differ within versus between them. Multi-locus value is a ratio of sums over loci. Can be slightly negative when the samples do not differ; shown as computed.',
    formula: 'F_ST = 1 − ΣH_w / ΣH_b',
    citation: 'Hudson, R. R., Slatkin, M., Maddison, W. P. (1992). Genetics 132: 583–589; ratio of averages as recommended by Bhatia et al. (2013), Genome Research 23: 1514–1521.',
  },
  'weir-cockerham': {
    title: 'F_ST, Weir & Cockerham θ',
    text: 'Differentiation from variance components among subpopulations (a), among individuals (b) and within individuals (c), summed over alleles and loci. Can be slightly negative when the samples do not differ; shown as computed.',
    formula: 'θ = Σa / Σ(a + b + c)',
    citation: 'Weir, B. S., Cockerham, C. C. (1984). Estimating F-statistics for the analysis of population structure. Evolution 38: 1358–1370.',
  },
} as const satisfies Record<string, GeneticMethodNote>
export type GeneticMethodKey = keyof typeof GENETIC_METHOD_NOTES
