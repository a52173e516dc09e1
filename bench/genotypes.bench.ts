/**
 * Genotype summaries on upload-sized data: parsing (CSV, VCF), validation,
 * diversity summary, rarefied richness, pairwise F_ST and an F_ST matrix.
 * Synthetic data from a fixed-seed generator. `npx tsx bench/run.ts genotypes`.
 */
import { performance } from 'node:perf_hooks'
import {
  allelicRichness,
  fstMatrix,
  type Genotype,
  type GenotypeDataset,
  pairwiseFst,
  parseGenotypeCsv,
  parseVcf,
  summarizeGenotypes,
  validateGenotypeDataset,
} from '../shared/genetics/genotypes'

/** Small deterministic generator (32-bit LCG) so runs are comparable. */
function generator(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0
    return state / 2 ** 32
  }
}

function syntheticDataset(individuals: number, loci: number, allelesPerLocus: number, seed: number, labels?: string[]): GenotypeDataset {
  const next = generator(seed)
  const pick = (): string => {
    const index = Math.floor(next() ** 2 * allelesPerLocus) // skewed frequencies, some rare alleles
    return labels?.[index] ?? String(100 + 2 * index)
  }
  return {
    loci: Array.from({ length: loci }, (_, index) => `L${index + 1}`),
    individuals: Array.from({ length: individuals }, (_, index) => ({
      id: `I${index + 1}`,
      genotypes: Array.from({ length: loci }, (): Genotype | null => (next() < 0.03 ? null : [pick(), pick()])),
    })),
  }
}

function toCsv(dataset: GenotypeDataset): string {
  const header = ['id', ...dataset.loci.flatMap(locus => [`${locus}_1`, `${locus}_2`])].join(',')
  const rows = dataset.individuals.map(individual => [individual.id, ...individual.genotypes.flatMap(genotype => genotype ?? ['0', '0'])].join(','))
  return `${[header, ...rows].join('\n')}\n`
}

function toVcf(dataset: GenotypeDataset): string {
  const header = ['##fileformat=VCFv4.2', ['#CHROM', 'POS', 'ID', 'REF', 'ALT', 'QUAL', 'FILTER', 'INFO', 'FORMAT', ...dataset.individuals.map(individual => individual.id)].join('\t')]
  const lines = dataset.loci.map((locus, index) => ['1', String(index + 1), locus, 'A', 'G', '.', 'PASS', '.', 'GT',
    ...dataset.individuals.map((individual) => {
      const genotype = individual.genotypes[index]
      return genotype ? genotype.map(allele => (allele === 'A' ? '0' : '1')).join('/') : './.'
    })].join('\t'))
  return `${[...header, ...lines].join('\n')}\n`
}

function time(label: string, repeats: number, body: () => unknown): number {
  body() // warm-up
  const start = performance.now()
  for (let i = 0; i < repeats; i++) body()
  const milliseconds = (performance.now() - start) / repeats
  console.log(`${label.padEnd(64)} ${milliseconds.toFixed(2).padStart(9)} ms`)
  return milliseconds
}

export default async function (): Promise<void> {
  const microsatellites = syntheticDataset(300, 50, 12, 1)
  const microsatellitesOther = syntheticDataset(200, 50, 12, 2)
  const snps = syntheticDataset(200, 20_000, 2, 3, ['A', 'G'])
  const snpsOther = syntheticDataset(150, 20_000, 2, 4, ['A', 'G'])
  const csv = toCsv(microsatellites)
  const vcf = toVcf(snps)
  const genotypeCount = (dataset: GenotypeDataset) => dataset.loci.length * dataset.individuals.length

  console.log(`microsatellites: 300 individuals × 50 loci (${(csv.length / 1024).toFixed(0)} KiB CSV); SNPs: 200 × 20 000 (${(vcf.length / 2 ** 20).toFixed(1)} MiB VCF)`)
  const csvMs = time('parseGenotypeCsv, 300 × 50', 20, () => parseGenotypeCsv(csv))
  const vcfMs = time('parseVcf, 200 samples × 20 000 sites', 3, () => parseVcf(vcf))
  console.log(`  per genotype: CSV ${(csvMs * 1e6 / genotypeCount(microsatellites)).toFixed(0)} ns, VCF ${(vcfMs * 1e6 / genotypeCount(snps)).toFixed(0)} ns`)

  const validateMs = time('validateGenotypeDataset, SNPs 200 × 20 000', 5, () => validateGenotypeDataset(snps))
  const summaryMs = time('summarizeGenotypes, SNPs 200 × 20 000', 5, () => summarizeGenotypes(snps))
  console.log(`  validation share of summarizeGenotypes: ${(100 * validateMs / summaryMs).toFixed(0)} %`)
  time('summarizeGenotypes, microsatellites 300 × 50', 50, () => summarizeGenotypes(microsatellites))

  for (const size of [10, 100, 400]) {
    time(`allelicRichness, microsatellites, g = ${size}`, 50, () => allelicRichness(microsatellites, size))
  }

  const hudsonMs = time('pairwiseFst hudson, SNPs 200 vs 150 × 20 000', 5, () => pairwiseFst(snps, snpsOther, { method: 'hudson' }))
  const wcMs = time('pairwiseFst weir-cockerham, SNPs 200 vs 150 × 20 000', 5, () => pairwiseFst(snps, snpsOther, { method: 'weir-cockerham' }))
  console.log(`  ratio weir-cockerham / hudson: ${(wcMs / hudsonMs).toFixed(2)}×`)
  time('pairwiseFst weir-cockerham, microsatellites 300 vs 200 × 50', 50, () => pairwiseFst(microsatellites, microsatellitesOther, { method: 'weir-cockerham' }))

  const populations = Array.from({ length: 10 }, (_, index) => ({ name: `P${index + 1}`, dataset: syntheticDataset(40, 50, 12, 10 + index) }))
  const matrixMs = time('fstMatrix weir-cockerham, 10 populations × 40 × 50 (45 pairs)', 10, () => fstMatrix(populations, { method: 'weir-cockerham' }))
  const pairMs = time('pairwiseFst weir-cockerham, one of those pairs', 200, () => pairwiseFst(populations[0]?.dataset ?? microsatellites, populations[1]?.dataset ?? microsatellites, { method: 'weir-cockerham' }))
  console.log(`  matrix / (45 × pair): ${(matrixMs / (45 * pairMs)).toFixed(2)} (each dataset tallied and validated once)`)
}
