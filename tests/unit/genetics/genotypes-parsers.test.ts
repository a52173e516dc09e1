/**
 * CSV and VCF readers: documented format, line-numbered errors, and
 * properties (round trip; a corrupted row is reported on its own line).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  type Genotype,
  type GenotypeDataset,
  type GenotypeParseResult,
  MAX_PARSE_ERRORS,
  parseGenotypeCsv,
  parseVcf,
  validateGenotypeDataset,
} from '../../../shared/genetics/genotypes'

function datasetOf(result: GenotypeParseResult): GenotypeDataset {
  if ('errors' in result) throw new Error(`unexpected errors: ${JSON.stringify(result.errors)}`)
  return result.dataset
}

function errorsOf(result: GenotypeParseResult): { line: number, message: string }[] {
  if (!('errors' in result)) throw new Error('expected errors, got a dataset')
  return result.errors
}

describe('parseGenotypeCsv', () => {
  it('reads the documented format: id column, <locus>_1/<locus>_2 pairs, missing codes 0, NA and empty', () => {
    const text = 'id,Loc1_1,Loc1_2,Loc2_1,Loc2_2\nAH1,101,103,200,200\nAH2,0,0,NA,NA\nAH3,105,101,,\n'
    expect(datasetOf(parseGenotypeCsv(text))).toEqual({
      loci: ['Loc1', 'Loc2'],
      individuals: [
        { id: 'AH1', genotypes: [['101', '103'], ['200', '200']] },
        { id: 'AH2', genotypes: [null, null] },
        { id: 'AH3', genotypes: [['105', '101'], null] },
      ],
    })
  })

  it('accepts CRLF/CR line ends, a byte-order mark, blank lines, spaces, quotes and padded rows', () => {
    const text = '\uFEFFanimal , "Loc_A_1","Loc_A_2"\r\n\r\n " AH,1" , 101 ,"103"\r,,,\rAH2,"1""2",7,,\r\n'
    expect(datasetOf(parseGenotypeCsv(text))).toEqual({
      loci: ['Loc_A'],
      individuals: [{ id: 'AH,1', genotypes: [['101', '103']] }, { id: 'AH2', genotypes: [['1"2', '7']] }],
    })
  })

  it('detects semicolon and tab separators, or takes the one given', () => {
    expect(datasetOf(parseGenotypeCsv('id;L_1;L_2\nA;1;2\n')).loci).toEqual(['L'])
    expect(datasetOf(parseGenotypeCsv('id\tL_1\tL_2\nA\t1\t2\n')).individuals[0]?.genotypes).toEqual([['1', '2']])
    expect(datasetOf(parseGenotypeCsv('id;L_1;L_2\nA;1,5;2\n', { delimiter: ';' })).individuals[0]?.genotypes).toEqual([['1,5', '2']])
  })

  it('uses the missing-data codes given', () => {
    const result = datasetOf(parseGenotypeCsv('id,L_1,L_2\nA,-9,-9\nB,0,101\n', { missing: ['-9'] }))
    expect(result.individuals.map(individual => individual.genotypes[0])).toEqual([null, ['0', '101']])
    expect(errorsOf(parseGenotypeCsv('id,L_1,L_2\nA,,\n', { missing: ['-9'] }))).toEqual([
      { line: 2, message: 'locus "L": empty cell; write both alleles or a missing-data code such as 0' },
    ])
  })

  it('reports header problems on the header line', () => {
    expect(errorsOf(parseGenotypeCsv('\n\nid,L_1\n'))).toEqual([{ line: 3, message: expect.stringContaining('two columns per locus') }])
    expect(errorsOf(parseGenotypeCsv('id,L_1,M_2\nA,1,2\n'))).toEqual([{ line: 1, message: 'column 3 header is "M_2"; expected "L_2" right after "L_1"' }])
    expect(errorsOf(parseGenotypeCsv('id,L_a,L_b\n'))[0]?.message).toMatch(/column 2 header is "L_a"; expected "<locus>_1"/)
    expect(errorsOf(parseGenotypeCsv('id,L_1,L_2,L_1,L_2\n'))).toEqual([{ line: 1, message: 'locus "L" has more than one pair of columns' }])
    expect(errorsOf(parseGenotypeCsv('L_1,L_2,M_1\n'))[0]?.message).toMatch(/first column must hold the individual ids/)
    expect(errorsOf(parseGenotypeCsv('   \n'))).toEqual([{ line: 1, message: 'the file is empty' }])
    expect(errorsOf(parseGenotypeCsv('id,L_1,L_2\n\n'))).toEqual([{ line: 1, message: expect.stringContaining('no individuals') }])
  })

  it('reports every malformed row with its line number', () => {
    const text = [
      'id,Loc1_1,Loc1_2,Loc2_1,Loc2_2', // 1
      'AH1,101,103,200,200', // 2
      'AH2,101,103,200', // 3: short row
      '', // 4: blank, skipped
      'AH3,101,0,200,200', // 5: half missing
      ',101,101,200,200', // 6: no id
      'AH1,101,101,200,200', // 7: duplicate id
      'AH4,"101,103,200,200', // 8: unclosed quote
    ].join('\n')
    expect(errorsOf(parseGenotypeCsv(text))).toEqual([
      { line: 3, message: 'has 4 columns; the header has 5' },
      { line: 5, message: 'locus "Loc1": one allele is missing ("101" and "0"); give both alleles or mark both as missing' },
      { line: 6, message: 'the id column is empty' },
      { line: 7, message: 'id "AH1" is already used on line 2' },
      { line: 8, message: 'a quoted field opened at column 2 is not closed on this line' },
    ])
  })

  it(`stops after ${MAX_PARSE_ERRORS} errors and says so`, () => {
    const rows = Array.from({ length: 150 }, (_, index) => `I${index},1`)
    const errors = errorsOf(parseGenotypeCsv(['id,L_1,L_2', ...rows].join('\n')))
    expect(errors).toHaveLength(MAX_PARSE_ERRORS + 1)
    expect(errors.at(-1)).toEqual({ line: MAX_PARSE_ERRORS + 1, message: expect.stringContaining('stopped reading') })
  })
})

const VCF_HEADER = '##fileformat=VCFv4.2\n##source=invented\n#CHROM\tPOS\tID\tREF\tALT\tQUAL\tFILTER\tINFO\tFORMAT\tS1\tS2\tS3\n'

describe('parseVcf', () => {
  it('reads biallelic SNPs: GT among other FORMAT fields, phased or unphased, missing calls, ID or CHROM:POS', () => {
    const text = `${VCF_HEADER}1\t100\trs1\tA\tG\t50\tPASS\tDP=10\tGT:DP\t0/1:4\t1|1:3\t./.:0\n`
      + '1\t250\t.\tc\tt\t.\tq10\t.\tDP:GT\t7:0|0\t2:.|.\t1:.\n'
      + '2\t5\trs3\tT\t.\t.\t.\t.\tGT\t0/0\t0|0\n'.replace('0|0\n', '0|0\t.\n')
    expect(datasetOf(parseVcf(text))).toEqual({
      loci: ['rs1', '1:250', 'rs3'],
      individuals: [
        { id: 'S1', genotypes: [['A', 'G'], ['C', 'C'], ['T', 'T']] },
        { id: 'S2', genotypes: [['G', 'G'], null, ['T', 'T']] },
        { id: 'S3', genotypes: [null, null, null] },
      ],
    })
  })

  it('requires the VCF 4.x format line, the column header and at least one sample and site', () => {
    expect(errorsOf(parseVcf('#CHROM\tPOS\n'))).toEqual([{ line: 1, message: expect.stringContaining('##fileformat=VCFv4.x') }])
    expect(errorsOf(parseVcf('##fileformat=VCFv4.1\n1\t100\trs1\tA\tG\t.\t.\t.\tGT\t0/1\n'))).toEqual([{ line: 2, message: 'data line before the #CHROM column header' }])
    expect(errorsOf(parseVcf('##fileformat=VCFv4.1\n#CHROM\tPOS\tID\tREF\tALT\tQUAL\tFILTER\tINFO\tFORMAT\n'))).toEqual([{ line: 2, message: expect.stringContaining('no sample columns') }])
    expect(errorsOf(parseVcf('##fileformat=VCFv4.1\n#CHROM POS ID\n'))).toEqual([{ line: 2, message: expect.stringContaining('must start with #CHROM POS ID') }])
    expect(errorsOf(parseVcf(VCF_HEADER))).toEqual([{ line: 3, message: expect.stringContaining('no sites') }])
    expect(errorsOf(parseVcf('##fileformat=VCFv4.1\n##x=1\n'))[0]?.message).toMatch(/no #CHROM column header/)
    expect(errorsOf(parseVcf('##fileformat=VCFv4.1\n#CHROM\tPOS\tID\tREF\tALT\tQUAL\tFILTER\tINFO\tFORMAT\tS\tS\n'))).toEqual([{ line: 2, message: 'sample "S" appears more than once' }])
  })

  it('rejects multi-allelic sites, indels, bad calls and duplicate sites with their line numbers', () => {
    const text = `${VCF_HEADER}` // lines 1–3
      + '1\t100\trs1\tA\tG\t.\t.\t.\tGT\t0/1\t0/0\t1/1\n' // 4 fine
      + '1\t101\trs2\tA\tG,T\t.\t.\t.\tGT\t0/1\t1/2\t0/0\n' // 5 multi-allelic
      + '1\t102\trs3\tAT\tA\t.\t.\t.\tGT\t0/1\t0/0\t0/0\n' // 6 indel
      + '1\t103\trs4\tA\tG\t.\t.\t.\tGT\t0\t0/0\t0/0\n' // 7 haploid
      + '1\t104\trs5\tA\tG\t.\t.\t.\tGT\t./1\t0/0\t0/0\n' // 8 half missing
      + '1\t105\trs6\tA\tG\t.\t.\t.\tGT\t0/2\t0/0\t0/0\n' // 9 allele index 2
      + '1\t106\trs7\tA\tG\t.\t.\t.\tGT\t0/1\t0/0\n' // 10 column missing
      + '1\t107\trs8\tA\tG\t.\t.\t.\tDP\t3\t4\t5\n' // 11 no GT
      + '1\t108\trs1\tA\tG\t.\t.\t.\tGT\t0/1\t0/0\t0/1/1\n' // 12 duplicate id, triploid call
      + '1\tabc\trs9\tA\tG\t.\t.\t.\tGT\t0/1\t0/0\t0/0\n' // 13 POS not a number
      + '1\t-5\trs10\tA\tG\t.\t.\t.\tGT\t0/1\t0/0\t0/0\n' // 14 negative POS
      + ' \t110\trs11\tA\tG\t.\t.\t.\tGT\t0/1\t0/0\t0/0\n' // 15 blank CHROM
    expect(errorsOf(parseVcf(text))).toEqual([
      { line: 5, message: 'multi-allelic site (ALT "G,T"); only biallelic SNPs are supported, split or remove this site' },
      { line: 6, message: 'REF "AT" is not a single base; only biallelic SNPs are supported' },
      { line: 7, message: 'sample "S1": genotype "0" is haploid; only diploid calls such as 0/1 or 0|1 are supported' },
      { line: 8, message: 'sample "S1": genotype "./1" has one allele missing; use ./. for a missing call' },
      { line: 9, message: 'sample "S1": genotype "0/2" refers to an allele the site does not list (REF, ALT only)' },
      { line: 10, message: 'has 11 tab-separated columns; the header on line 3 has 12' },
      { line: 11, message: 'FORMAT "DP" has no GT field, so the site has no genotypes' },
      { line: 12, message: 'sample "S3": genotype "0/1/1" has more than two alleles; only diploid calls such as 0/1 or 0|1 are supported' },
      { line: 12, message: 'site "rs1" already appears on line 4' },
      { line: 13, message: 'POS "abc" is not a position (a whole number such as 10452)' },
      { line: 14, message: 'POS "-5" is not a position (a whole number such as 10452)' },
      { line: 15, message: 'CHROM " " is not a chromosome name (it must be non-empty, without spaces)' },
    ])
  })
})

// ---------------------------------------------------------------- properties
const CSV_ALLELES = ['101', '103', '105', 'A', 'G', 'x 1'] as const

const csvDataset = fc.integer({ min: 1, max: 4 }).chain(locusCount => fc.record({
  loci: fc.uniqueArray(fc.stringMatching(/^[A-Za-z][A-Za-z0-9]{0,5}$/), { minLength: locusCount, maxLength: locusCount }),
  rows: fc.array(fc.array(fc.option(fc.tuple(fc.constantFrom(...CSV_ALLELES), fc.constantFrom(...CSV_ALLELES)), { nil: null, freq: 4 }), { minLength: locusCount, maxLength: locusCount }), { minLength: 1, maxLength: 12 }),
})).map(({ loci, rows }): GenotypeDataset => ({
  loci,
  individuals: rows.map((genotypes, index) => ({ id: `ind ${index + 1}`, genotypes: genotypes as (Genotype | null)[] })),
}))

/** Writes a dataset in the documented CSV format; `blankAfter` inserts blank lines after those rows. */
function toCsv(dataset: GenotypeDataset, blankAfter: ReadonlySet<number> = new Set()): { text: string, rowLines: number[] } {
  const lines = [['id', ...dataset.loci.flatMap(locus => [`${locus}_1`, `${locus}_2`])].join(',')]
  const rowLines: number[] = []
  dataset.individuals.forEach((individual, index) => {
    lines.push([individual.id, ...individual.genotypes.flatMap(genotype => genotype ?? ['0', '0'])].join(','))
    rowLines.push(lines.length)
    if (blankAfter.has(index)) lines.push('')
  })
  return { text: `${lines.join('\n')}\n`, rowLines }
}

describe('parser properties', () => {
  it('CSV: writing a dataset and reading it back gives the same, valid dataset', () => {
    fc.assert(fc.property(csvDataset, (dataset) => {
      const parsed = datasetOf(parseGenotypeCsv(toCsv(dataset).text))
      expect(parsed).toEqual(dataset)
      expect(validateGenotypeDataset(parsed)).toEqual({ ok: true })
    }))
  })

  it('CSV: a corrupted row is reported on its own line, even after blank lines', () => {
    const corruption = fc.constantFrom('drop-cell', 'half-missing', 'no-id', 'duplicate-id')
    fc.assert(fc.property(csvDataset, fc.nat(), fc.array(fc.nat({ max: 11 })), corruption, (dataset, pick, blanks, kind) => {
      fc.pre(dataset.individuals.length >= 2)
      const { text, rowLines } = toCsv(dataset, new Set(blanks))
      const target = 1 + (pick % (dataset.individuals.length - 1)) // never the first row
      const lineNumber = rowLines[target] ?? 0
      const lines = text.split('\n')
      const cells = (lines[lineNumber - 1] ?? '').split(',')
      if (kind === 'drop-cell') cells.pop()
      if (kind === 'half-missing') {
        cells[1] = '101'
        cells[2] = '0'
      }
      if (kind === 'no-id') cells[0] = ''
      if (kind === 'duplicate-id') cells[0] = dataset.individuals[0]?.id ?? ''
      lines[lineNumber - 1] = cells.join(',')
      const errors = errorsOf(parseGenotypeCsv(lines.join('\n')))
      expect(errors.map(error => error.line)).toEqual([lineNumber])
    }))
  })

  const BASES = ['A', 'C', 'G', 'T'] as const
  const vcfSites = fc.array(fc.record({
    ref: fc.constantFrom(...BASES),
    altOffset: fc.integer({ min: 1, max: 3 }),
    calls: fc.array(fc.constantFrom('0/0', '0/1', '1|0', '1|1', './.', '.'), { minLength: 3, maxLength: 3 }),
  }), { minLength: 1, maxLength: 10 })

  function toVcf(sites: { ref: string, altOffset: number, calls: string[] }[]): string {
    return VCF_HEADER + sites.map((site, index) => {
      const alt = BASES[(BASES.indexOf(site.ref as typeof BASES[number]) + site.altOffset) % 4]
      return ['chr1', String(100 + index), `snp${index}`, site.ref, alt, '.', 'PASS', '.', 'GT', ...site.calls].join('\t')
    }).join('\n')
  }

  it('VCF: every call maps to the REF/ALT bases (or null) at the right sample and site', () => {
    fc.assert(fc.property(vcfSites, (sites) => {
      const dataset = datasetOf(parseVcf(toVcf(sites)))
      expect(dataset.loci).toEqual(sites.map((_, index) => `snp${index}`))
      sites.forEach((site, siteIndex) => {
        const alt = BASES[(BASES.indexOf(site.ref as typeof BASES[number]) + site.altOffset) % 4] ?? ''
        site.calls.forEach((call, sampleIndex) => {
          const expected = call.startsWith('.') ? null : call.split(/[/|]/).map(index => (index === '0' ? site.ref : alt))
          expect(dataset.individuals[sampleIndex]?.genotypes[siteIndex]).toEqual(expected)
        })
      })
    }))
  })

  it('VCF: a corrupted site is reported on its own line', () => {
    const corruption = fc.constantFrom('multi-allelic', 'drop-column', 'haploid', 'indel', 'position')
    fc.assert(fc.property(vcfSites, fc.nat(), corruption, (sites, pick, kind) => {
      const lines = toVcf(sites).split('\n')
      const lineNumber = 4 + (pick % sites.length) // the header takes lines 1–3
      const columns = (lines[lineNumber - 1] ?? '').split('\t')
      if (kind === 'multi-allelic') columns[4] = `${columns[4]},N`
      if (kind === 'drop-column') columns.pop()
      if (kind === 'haploid') columns[9] = '1'
      if (kind === 'indel') columns[3] = `${columns[3]}A`
      if (kind === 'position') columns[1] = `${columns[1]}.5`
      lines[lineNumber - 1] = columns.join('\t')
      expect(errorsOf(parseVcf(lines.join('\n'))).map(error => error.line)).toEqual([lineNumber])
    }))
  })
})
