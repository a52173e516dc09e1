import { ParseErrorList, splitLines } from './parse-errors'
import type { Genotype, GenotypeParseResult } from './types'

const FIXED_COLUMNS = ['#CHROM', 'POS', 'ID', 'REF', 'ALT', 'QUAL', 'FILTER', 'INFO', 'FORMAT'] as const
const BASE = /^[ACGTN]$/
const DIPLOID_CALL = /^(\d+|\.)[/|](\d+|\.)$/
/** CHROM: any identifier without white space (VCF 4.3 §1.6.1). */
const CHROMOSOME = /^\S+$/
/** POS: a non-negative integer, 1-based (0 stands for a telomere; VCF 4.3 §1.6.1). */
const POSITION = /^\d{1,10}$/

interface VcfSite {
  locus: string
  /** allele label by allele index: [REF] or [REF, ALT] */
  alleles: string[]
  /** one entry per sample */
  genotypes: (Genotype | null)[]
}

interface VcfHeader {
  samples: string[]
  lineNumber: number
}

function readHeader(line: string, lineNumber: number, errors: ParseErrorList): VcfHeader | null {
  const columns = line.split('\t')
  const fixedOk = FIXED_COLUMNS.every((name, index) => columns[index] === name)
  if (!fixedOk) {
    errors.add(lineNumber, `the column header must start with ${FIXED_COLUMNS.join(' ')} separated by tabs`)
    return null
  }
  const samples = columns.slice(FIXED_COLUMNS.length)
  if (samples.length === 0) {
    errors.add(lineNumber, 'the file has no sample columns after FORMAT, so there are no genotypes')
    return null
  }
  const seen = new Set<string>()
  for (const sample of samples) {
    if (sample.trim() === '') errors.add(lineNumber, 'a sample column has an empty name')
    else if (seen.has(sample)) errors.add(lineNumber, `sample "${sample}" appears more than once`)
    seen.add(sample)
  }
  return { samples, lineNumber }
}

function readAlleles(reference: string, alternate: string, lineNumber: number, errors: ParseErrorList): string[] | null {
  const ref = reference.toUpperCase()
  const alt = alternate.toUpperCase()
  if (alt.includes(',')) {
    errors.add(lineNumber, `multi-allelic site (ALT "${alternate}"); only biallelic SNPs are supported, split or remove this site`)
    return null
  }
  if (!BASE.test(ref)) {
    errors.add(lineNumber, `REF "${reference}" is not a single base; only biallelic SNPs are supported`)
    return null
  }
  if (alt === '.') return [ref]
  if (!BASE.test(alt)) {
    errors.add(lineNumber, `ALT "${alternate}" is not a single base; only biallelic SNPs are supported`)
    return null
  }
  if (alt === ref) {
    errors.add(lineNumber, `ALT "${alternate}" is the same base as REF`)
    return null
  }
  return [ref, alt]
}

/** The GT sub-field of one sample column ('.' when absent). */
function gtOf(field: string | undefined, gtIndex: number): string {
  if (field === undefined) return '.'
  if (gtIndex === 0) {
    // GT comes first by the specification: avoid splitting the whole field.
    const end = field.indexOf(':')
    return end < 0 ? field : field.slice(0, end)
  }
  return field.split(':')[gtIndex] ?? '.'
}

/** Fast path for the usual one-digit calls "0/1", "1|1": the allele pair, or null to use the general reader. */
function simpleCall(call: string, alleles: string[]): Genotype | null {
  if (call.length !== 3) return null
  const separator = call.charCodeAt(1)
  if (separator !== 47 && separator !== 124) return null // '/' or '|'
  const first = alleles[call.charCodeAt(0) - 48]
  const second = alleles[call.charCodeAt(2) - 48]
  return first !== undefined && second !== undefined ? [first, second] : null
}

function readCall(field: string | undefined, gtIndex: number, alleles: string[], sample: string, lineNumber: number, errors: ParseErrorList): Genotype | null {
  const call = gtOf(field, gtIndex)
  if (call === '.' || call === '') return null
  const simple = simpleCall(call, alleles)
  if (simple) return simple
  const parts = DIPLOID_CALL.exec(call)
  if (!parts) {
    const kind = /^(\d+|\.)$/.test(call) ? 'is haploid' : /^(\d+|\.)([/|](\d+|\.)){2,}$/.test(call) ? 'has more than two alleles' : 'is not a valid GT value'
    errors.add(lineNumber, `sample "${sample}": genotype "${call}" ${kind}; only diploid calls such as 0/1 or 0|1 are supported`)
    return null
  }
  const first = parts[1] ?? '.'
  const second = parts[2] ?? '.'
  if (first === '.' && second === '.') return null
  if (first === '.' || second === '.') {
    errors.add(lineNumber, `sample "${sample}": genotype "${call}" has one allele missing; use ./. for a missing call`)
    return null
  }
  const firstAllele = alleles[Number(first)]
  const secondAllele = alleles[Number(second)]
  if (firstAllele === undefined || secondAllele === undefined) {
    errors.add(lineNumber, `sample "${sample}": genotype "${call}" refers to an allele the site does not list (REF${alleles.length > 1 ? ', ALT' : ''} only)`)
    return null
  }
  return [firstAllele, secondAllele]
}

function readSite(line: string, lineNumber: number, header: VcfHeader, errors: ParseErrorList): VcfSite | null {
  const columns = line.split('\t')
  const expected = FIXED_COLUMNS.length + header.samples.length
  if (columns.length !== expected) {
    errors.add(lineNumber, `has ${columns.length} tab-separated columns; the header on line ${header.lineNumber} has ${expected}`)
    return null
  }
  const [chrom = '', pos = '', id = '', ref = '', alt = '', , , , format = ''] = columns
  if (!CHROMOSOME.test(chrom)) {
    errors.add(lineNumber, `CHROM "${chrom}" is not a chromosome name (it must be non-empty, without spaces)`)
    return null
  }
  if (!POSITION.test(pos)) {
    errors.add(lineNumber, `POS "${pos}" is not a position (a whole number such as 10452)`)
    return null
  }
  const alleles = readAlleles(ref, alt, lineNumber, errors)
  if (!alleles) return null
  const gtIndex = format.split(':').indexOf('GT')
  if (gtIndex < 0) {
    errors.add(lineNumber, `FORMAT "${format}" has no GT field, so the site has no genotypes`)
    return null
  }
  const locus = id !== '.' && id !== '' ? id : `${chrom}:${pos}`
  const genotypes = header.samples.map((sample, index) =>
    readCall(columns[FIXED_COLUMNS.length + index], gtIndex, alleles, sample, lineNumber, errors))
  return { locus, alleles, genotypes }
}

/**
 * Reads a VCF 4.x file of biallelic SNPs into a `GenotypeDataset` (one locus
 * per site, one individual per sample). Pure string → data (no I/O), used by
 * the browser preview and the server; no third-party parser.
 *
 * Accepted input:
 * - Line 1 is `##fileformat=VCFv4.x`; other `##` meta lines are skipped.
 * - The `#CHROM POS ID REF ALT QUAL FILTER INFO FORMAT <samples…>` header
 *   (tab-separated) names the samples; sample names must be unique.
 * - Each data line is one site: CHROM without white space, POS a whole
 *   number, a single-base REF and a single-base ALT
 *   (or `.` for a monomorphic site). Multi-allelic sites (ALT with a comma),
 *   indels and symbolic alleles are rejected with their line number.
 * - The locus name is the ID column, or `CHROM:POS` when ID is `.`; it must
 *   be unique.
 * - Genotypes come from the GT field of FORMAT: diploid calls `a/b`
 *   (unphased) or `a|b` (phased; phase is ignored). `./.`, `.|.`, `.` or an
 *   absent field mean missing; a half-missing call (`./1`) is an error.
 * - Alleles are stored as the bases (REF/ALT letters, upper case), so sites
 *   from different files compare correctly even if REF differs.
 * - FILTER, QUAL and INFO are ignored: every site in the file is used.
 * Errors carry the 1-based line number; all errors are reported (up to
 * `MAX_PARSE_ERRORS`).
 * Reference: The Variant Call Format specification, VCFv4.3 (samtools/hts-specs).
 *
 * @param text - the whole file as a string
 * @returns `{ dataset }` or `{ errors: [{ line, message }] }`
 * @example parseVcf('##fileformat=VCFv4.2\n#CHROM\tPOS\tID\tREF\tALT\tQUAL\tFILTER\tINFO\tFORMAT\tS1\tS2\n'
 *   + '1\t100\trs1\tA\tG\t.\tPASS\t.\tGT\t0/1\t./.\n')
 *   // { dataset: { loci: ['rs1'], individuals: [{ id: 'S1', genotypes: [['A', 'G']] }, { id: 'S2', genotypes: [null] }] } }
 * @example parseVcf(sameHeader + '1\t100\trs1\tA\tG,T\t.\tPASS\t.\tGT\t0/1\t1/2\n')
 *   // { errors: [{ line: 3, message: 'multi-allelic site (ALT "G,T"); only biallelic SNPs are supported, split or remove this site' }] }
 */
export function parseVcf(text: string): GenotypeParseResult {
  const errors = new ParseErrorList()
  const lines = splitLines(text)
  if (!/^##fileformat=VCFv4\.\d+\s*$/.test(lines[0] ?? '')) {
    return { errors: [{ line: 1, message: 'line 1 must be "##fileformat=VCFv4.x" (this reader accepts VCF version 4 files)' }] }
  }
  let header: VcfHeader | null = null
  const sites: VcfSite[] = []
  const locusLines = new Map<string, number>()
  for (let index = 1; index < lines.length && !errors.full; index++) {
    const line = lines[index] ?? ''
    const lineNumber = index + 1
    if (line.trim() === '' || line.startsWith('##')) continue
    if (line.startsWith('#')) {
      if (header) errors.add(lineNumber, `a second column header line; the first is on line ${header.lineNumber}`)
      else header = readHeader(line, lineNumber, errors) ?? { samples: [], lineNumber }
      if (header.samples.length === 0) break
      continue
    }
    if (!header) {
      errors.add(lineNumber, 'data line before the #CHROM column header')
      break
    }
    const site = readSite(line, lineNumber, header, errors)
    if (!site) continue
    const previous = locusLines.get(site.locus)
    if (previous !== undefined) errors.add(lineNumber, `site "${site.locus}" already appears on line ${previous}`)
    locusLines.set(site.locus, lineNumber)
    sites.push(site)
  }
  if (!header && errors.empty) errors.add(lines.length, 'no #CHROM column header line was found')
  if (!errors.empty || !header) return { errors: errors.errors }
  if (sites.length === 0) return { errors: [{ line: header.lineNumber, message: 'no sites: the column header is not followed by any data line' }] }
  const samples = header.samples
  return {
    dataset: {
      loci: sites.map(site => site.locus),
      individuals: samples.map((id, sampleIndex) => ({
        id,
        genotypes: sites.map(site => site.genotypes[sampleIndex] ?? null),
      })),
    },
  }
}
