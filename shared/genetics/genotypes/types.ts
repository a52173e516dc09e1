/**
 * Data types shared by every genotype summary, parser and validator.
 *
 * A dataset is one population sample: diploid, co-dominant markers
 * (microsatellites or SNPs), one row per individual, one genotype per locus
 * in the order of `loci`. Alleles are text labels ("101", "A"); two alleles
 * are the same allele exactly when their labels are equal.
 */

/** The two alleles of a diploid genotype, in any order (unphased). */
export type Genotype = [string, string]

/** One sampled individual: its id and one genotype per locus (`null` = missing). */
export interface GenotypedIndividual {
  id: string
  genotypes: (Genotype | null)[]
}

/** One population sample; `individuals[i].genotypes[k]` is the genotype at `loci[k]`. */
export interface GenotypeDataset {
  loci: string[]
  individuals: GenotypedIndividual[]
}

/** A dataset with the name of the population it was sampled from. */
export interface NamedGenotypeDataset {
  name: string
  dataset: GenotypeDataset
}

/** A position-labelled problem found in an uploaded file (1-based line number). */
export interface GenotypeParseError {
  line: number
  message: string
}

/** Parser outcome: a dataset, or every problem found (with line numbers). */
export type GenotypeParseResult = { dataset: GenotypeDataset } | { errors: GenotypeParseError[] }
