/**
 * Hostile uploads on every route that takes a file, filling what attachments, genotypes,
 * census-import, atlas, brief and verify tests do not already cover:
 * - file names with path parts, NUL bytes, line breaks, quotes, bidirectional overrides,
 *   Windows paths, unicode and extreme length, sent as raw multipart bytes (as a hostile client
 *   would, not as a browser escapes them): the stored name is clean, the answer and the database
 *   agree, the storage key never contains it, and the download link's Content-Disposition is safe;
 *   (a regression test for a boundary nested thousands deep, which once answered 500, is here too);
 * - malformed CSV / VCF / GeoJSON / PKCS#12 / PDF contents and files of the wrong type behind a
 *   good name: 4xx with a sentence (or, for /api/verify, a "not valid" verdict), never 5xx;
 * - size limits on the logo, the certificate and the census file: 413 with the limit in words;
 * - after every refusal, no committed row change in any table (fuzz-writes.ts) and no new
 *   object in the object store.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { answerProblems, sendRaw, type RawAnswer } from './fuzz-http'
import { installWriteWatch, type WriteWatch } from './fuzz-writes'
import { ALDER_HOLLOW_CSV, SMALL_VCF, demoRecords, storedKeys } from './genotypes-support'
import { makeLogoPng } from './brief-support'

const server = useServer()
let biologist: ApiClient
let admin: ApiClient
let watch: WriteWatch
let subpopulationId: number
let speciesId: number

beforeAll(async () => {
  biologist = await server.signIn(demo.biologist)
  admin = await server.signIn(demo.admin)
  const records = await demoRecords(server)
  subpopulationId = records.subpopulations['Cinderbrook Cove']!
  speciesId = records.speciesId
  watch = await installWriteWatch(server.db)
})

/** One multipart part; `fileName` goes into the header as raw UTF-8 bytes, `fileNameStar` as RFC 5987 `filename*`. */
interface Part { name: string, value: string | Buffer, fileName?: string, fileNameStar?: string, type?: string }

const BOUNDARY = 'hostile-upload-boundary'

function multipart(parts: Part[]): Buffer {
  const pieces = parts.map((part) => {
    let disposition = `form-data; name="${part.name}"`
    if (part.fileName !== undefined) disposition += `; filename="${part.fileName}"`
    if (part.fileNameStar !== undefined) disposition += `; filename*=UTF-8''${part.fileNameStar}`
    const head = `--${BOUNDARY}\r\nContent-Disposition: ${disposition}\r\n${part.type ? `Content-Type: ${part.type}\r\n` : ''}\r\n`
    return Buffer.concat([Buffer.from(head, 'utf8'), Buffer.isBuffer(part.value) ? part.value : Buffer.from(part.value, 'utf8'), Buffer.from('\r\n')])
  })
  return Buffer.concat([...pieces, Buffer.from(`--${BOUNDARY}--\r\n`)])
}

async function post(client: ApiClient | null, path: string, body: Buffer, contentType = `multipart/form-data; boundary=${BOUNDARY}`): Promise<RawAnswer & { json: any }> { // eslint-disable-line @typescript-eslint/no-explicit-any -- answers are checked field by field
  const headers: Record<string, string> = { 'content-type': contentType }
  if (client) headers.cookie = client.cookieHeader
  const answer = await sendRaw(server.url, { method: 'POST', path, headers, body })
  let json: unknown = null
  try {
    json = JSON.parse(answer.text)
  } catch { /* not JSON: answerProblems reports it for errors */ }
  return { ...answer, json }
}

/**
 * Runs `request`, which must be refused with `status` and a readable message, and checks that
 * nothing was written to the database or the object store.
 */
async function expectRefusedWithoutTrace(status: number, request: () => Promise<RawAnswer & { json: any }>, message?: RegExp): Promise<void> { // eslint-disable-line @typescript-eslint/no-explicit-any -- see post()
  const keys = await storedKeys(server)
  const mark = await watch.mark()
  const answer = await request()
  expect(answer.status, answer.text).toBe(status)
  expect(answerProblems(answer)).toEqual([])
  if (message) expect(answer.json.message).toMatch(message)
  expect((await watch.since(mark)).writes).toEqual([])
  expect(await storedKeys(server)).toEqual(keys)
}

/** Fetches a presigned download link and returns the file's Content-Disposition. */
async function dispositionOf(linkPath: string, client: ApiClient): Promise<string> {
  const link = await client.get(linkPath)
  expect(link.status, JSON.stringify(link.body)).toBe(200)
  const file = await fetch(link.body.url)
  expect(file.status).toBe(200)
  await file.arrayBuffer()
  return file.headers.get('content-disposition') ?? ''
}

/** A Content-Disposition that names `expected` and cannot be broken out of. */
function expectSafeDisposition(header: string, expected: string): void {
  // eslint-disable-next-line no-control-regex -- a NUL byte is what must not be there
  expect(header).not.toMatch(/[\r\n\u0000]/)
  const match = /^attachment; filename="([^"]*)"; filename\*=UTF-8''([^\s;"]+)$/.exec(header)
  expect(match, header).not.toBeNull()
  const [, ascii, encoded] = match!
  expect(ascii).toMatch(/^[\u0020-\u007E]+$/)
  expect(ascii).not.toMatch(/[/\\]|\.\./)
  expect(decodeURIComponent(encoded!)).toBe(expected)
}

describe('file names with tricks: stored clean, downloaded under a safe Content-Disposition', () => {
  // [as sent in the header, how: raw bytes or RFC 5987, name kept]
  const names: Array<[string, 'raw' | 'star', string]> = [
    ['../../../etc/passwd.txt', 'raw', 'passwd.txt'],
    ['C:\\Users\\ann\\Desktop\\field notes.txt', 'raw', 'field notes.txt'],
    ['\\\\server\\share\\..\\notes.txt', 'raw', 'notes.txt'],
    [encodeURIComponent('report\u0000.txt'), 'star', 'report.txt'],
    [encodeURIComponent('line\r\nSet-Cookie: taken=1.txt'), 'star', 'lineSet-Cookie_ taken=1.txt'],
    [encodeURIComponent('quote"and\\back.txt'), 'star', 'back.txt'],
    ['invoice\u202Etxt.exe.txt', 'raw', 'invoicetxt.exe.txt'],
    ['zero\u200Bwidth\uFEFF.txt', 'raw', 'zerowidth.txt'],
    ['Cafe\u0301 re\u0301sume\u0301 🦎.txt', 'raw', 'Café résumé 🦎.txt'],
    [`${'𝕏'.repeat(70)}.txt`, 'raw', `${'𝕏'.repeat(58)}.txt`],
    [`${'n'.repeat(1000)}.txt`, 'raw', `${'n'.repeat(116)}.txt`],
    ['%2e%2e%2f%2e%2e%2fescape.txt', 'raw', '%2e%2e%2f%2e%2e%2fescape.txt'],
    ['..txt', 'raw', 'txt'],
  ]

  it.each(names)('attachment named %j', async (sent, how, kept) => {
    const file: Part = how === 'raw'
      ? { name: 'file', value: 'Field notes (invented).\n', fileName: sent, type: 'text/plain' }
      : { name: 'file', value: 'Field notes (invented).\n', fileName: 'fallback.txt', fileNameStar: sent, type: 'text/plain' }
    const answer = await post(biologist, `/api/subpopulations/${subpopulationId}/attachments`, multipart([file]))
    if (kept === 'txt') {
      // Nothing but an ending is left: no ending means no accepted type.
      expect(answer.status, answer.text).toBe(415)
      return
    }
    expect(answer.status, answer.text).toBe(201)
    expect(answer.json.fileName).toBe(kept)
    const row = await server.db.query<{ file_name: string, storage_key: string }>('SELECT file_name, storage_key FROM attachments WHERE id = $1', [answer.json.id])
    expect(row.rows[0]!.file_name).toBe(kept) // the database keeps exactly what the answer showed
    expect(row.rows[0]!.storage_key).toMatch(/^attachments\/agency-\d+\/owner-\d+\/[0-9a-f-]{36}$/)
    expectSafeDisposition(await dispositionOf(`/api/attachments/${answer.json.id}/download`, biologist), kept)
  })

  it('a NUL byte written raw into the multipart header is a malformed form: 422, nothing stored', async () => {
    const raw = multipart([{ name: 'file', value: 'Field notes (invented).\n', fileName: 'report\u0000.txt', type: 'text/plain' }])
    await expectRefusedWithoutTrace(422, () => post(biologist, `/api/subpopulations/${subpopulationId}/attachments`, raw), /malformed/)
  })

  it('genotype files: the same cleaning, and the download is safe too', async () => {
    const sent = `..\\..\\${'g'.repeat(200)}\u202E\u0000.csv`
    const kept = `${'g'.repeat(116)}.csv`
    const answer = await post(biologist, `/api/subpopulations/${subpopulationId}/genotypes`, multipart([
      { name: 'markerType', value: 'microsatellite' },
      { name: 'file', value: ALDER_HOLLOW_CSV, fileName: 'fallback.csv', fileNameStar: encodeURIComponent(sent), type: 'text/csv' },
    ]))
    expect(answer.status, answer.text).toBe(201)
    expect(answer.json.fileName).toBe(kept)
    const row = await server.db.query<{ file_name: string, storage_key: string }>('SELECT file_name, storage_key FROM genetic_datasets WHERE id = $1', [answer.json.id])
    expect(row.rows[0]).toMatchObject({ file_name: kept })
    expect(row.rows[0]!.storage_key).not.toMatch(/g{10}|\.\./)
    expectSafeDisposition(await dispositionOf(`/api/genotypes/${answer.json.id}/download`, biologist), kept)
    expect((await biologist.delete(`/api/genotypes/${answer.json.id}`)).status).toBe(204)
  })
})

describe('malformed files: a readable 4xx, nothing recorded, nothing stored', () => {
  const genotypes = () => `/api/subpopulations/${subpopulationId}/genotypes`
  const genotypeForm = (markerType: string, fileName: string, content: string | Buffer) => multipart([
    { name: 'markerType', value: markerType },
    { name: 'file', value: content, fileName, type: 'text/plain' },
  ])

  it.each([
    ['a VCF without the #CHROM header', 'snp', 'x.vcf', '##fileformat=VCFv4.2\n1\t100\tsnp1\tA\tG\t.\tPASS\t.\tGT\t0/1\n'],
    ['a VCF without samples', 'snp', 'x.vcf', '##fileformat=VCFv4.2\n#CHROM\tPOS\tID\tREF\tALT\tQUAL\tFILTER\tINFO\tFORMAT\n1\t100\tsnp1\tA\tG\t.\tPASS\t.\tGT\n'],
    ['a VCF with a genotype index past its alleles', 'snp', 'x.vcf', SMALL_VCF.replace('0/1\t0/0\t1/1', '0/7\t0/0\t1/1')],
    ['a VCF with a cut-off line', 'snp', 'x.vcf', `${SMALL_VCF.trimEnd()}\n2\t400\tsnp4\tG`],
    ['a VCF whose POS is a word', 'snp', 'x.vcf', SMALL_VCF.replace('1\t200\tsnp2', '1\ttwo-hundred\tsnp2')],
    ['a CSV with a quote left open', 'microsatellite', 'x.csv', ALDER_HOLLOW_CSV.replace('AH2,101', 'AH2,"101')],
    ['a CSV with only a header', 'microsatellite', 'x.csv', 'id,Loc1_1,Loc1_2\n'],
    ['a CSV with an odd number of allele columns', 'microsatellite', 'x.csv', 'id,Loc1_1,Loc1_2,Loc2_1\nA1,101,103,200\n'],
    ['an unknown marker type', 'isozyme', 'x.csv', ALDER_HOLLOW_CSV],
  ])('genotypes: %s', async (_label, markerType, fileName, content) => {
    await expectRefusedWithoutTrace(422, () => post(biologist, genotypes(), genotypeForm(markerType, fileName, content)))
  })

  it('genotypes: the wrong type behind a good name (binary in a .csv) → 415; no file part → 422; broken framing → 4xx', async () => {
    await expectRefusedWithoutTrace(415, () => post(biologist, genotypes(), genotypeForm('snp', 'x.csv', Buffer.from([0x50, 0x4B, 0x03, 0x04, 0, 0, 0]))), /do not look like/)
    await expectRefusedWithoutTrace(415, () => post(biologist, genotypes(), genotypeForm('snp', 'x.vcf', SMALL_VCF.replace('snp2', 'snp\u00002'))), /do not look like/)
    await expectRefusedWithoutTrace(422, () => post(biologist, genotypes(), multipart([{ name: 'markerType', value: 'snp' }])), /Choose a file/)
    await expectRefusedWithoutTrace(422, () => post(biologist, genotypes(), Buffer.from(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="x.csv"\r\n\r\nid,L1_1`)))
    await expectRefusedWithoutTrace(415, () => post(biologist, genotypes(), genotypeForm('snp', 'x.csv', ALDER_HOLLOW_CSV), 'multipart/form-data'))
  })

  const census = () => `/api/subpopulations/${subpopulationId}/census/import`
  it.each([
    ['a quote left open', 'year,count\n"2020,12\n'],
    ['a NUL byte in a cell', 'year,count\n2020,1\u00002\n'],
    ['a count of 1e999', 'year,count\n2020,1e999\n'],
    ['a formula', 'year,count\n=cmd|calc,@SUM(A1)\n'],
    ['only a header', 'year,count\n'],
    ['a thousand columns', `${Array.from({ length: 1000 }, (_, i) => `c${i}`).join(',')}\n${'1,'.repeat(999)}1\n`],
  ])('census CSV with %s', async (_label, csv) => {
    await expectRefusedWithoutTrace(422, () => post(biologist, census(), Buffer.from(csv, 'utf8'), 'text/csv'))
  })

  it('census CSV that is not UTF-8 (Latin-1) → 4xx, nothing recorded', async () => {
    const latin1 = Buffer.from('year,count,method\n2020,12,d\u00E9nombrement\n', 'latin1')
    const keys = await storedKeys(server)
    const mark = await watch.mark()
    const answer = await post(biologist, census(), latin1, 'text/csv')
    expect(answer.status === 422 || answer.status === 201, answer.text).toBe(true)
    expect(answerProblems(answer)).toEqual([])
    if (answer.status === 422) expect((await watch.since(mark)).writes).toEqual([])
    expect(await storedKeys(server)).toEqual(keys)
  })

  const atlasImport = () => `/api/species/${speciesId}/subpopulations/import`
  const geojson = (text: string) => Buffer.from(JSON.stringify({ format: 'geojson', text }))
  it.each([
    ['a FeatureCollection without features', '{"type":"FeatureCollection"}'],
    ['features that are not a list', '{"type":"FeatureCollection","features":{"0":{}}}'],
    ['a feature without a geometry', '{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"name":"No shape"},"geometry":null}]}'],
    ['coordinates that are text', '{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"name":"Text"},"geometry":{"type":"Point","coordinates":["-83","35"]}}]}'],
    ['a coordinate of 1e999 (Infinity once parsed)', '{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"name":"Far"},"geometry":{"type":"Point","coordinates":[1e999,35]}}]}'],
    ['coordinates nested 5000 deep', `{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"name":"Deep"},"geometry":{"type":"Polygon","coordinates":${'['.repeat(5000)}${']'.repeat(5000)}}}]}`],
    ['prototype keys in properties', '{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"__proto__":{"name":"x"},"constructor":{"prototype":{"a":1}}},"geometry":{"type":"Point","coordinates":[-83,35]}}]}'],
    ['a geometry of another kind', '{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"name":"Line"},"geometry":{"type":"LineString","coordinates":[[-83,35],[-82,36]]}}]}'],
    ['not GeoJSON at all', '<kml><Placemark/></kml>'],
  ])('species import: GeoJSON with %s', async (_label, text) => {
    await expectRefusedWithoutTrace(422, () => post(biologist, atlasImport(), geojson(text), 'application/json'))
  })

  it.each([
    ['a latitude of 91', 'name,latitude,longitude\nNorth of north,91,-83\n'],
    ['a quote left open', 'name,latitude,longitude\n"Open,35,-83\n'],
    ['a NUL byte in a name', 'name,latitude,longitude\nNul\u0000name,35,-83\n'],
    ['a formula for a name', 'name,latitude,longitude\n=HYPERLINK("x"),35,-83\n'],
  ])('species import: CSV with %s', async (_label, text) => {
    await expectRefusedWithoutTrace(422, () => post(biologist, atlasImport(), Buffer.from(JSON.stringify({ format: 'csv', text })), 'application/json'))
  })
})

describe('agency logo and certificate: size and type limits leave the agency as it was', () => {
  const GIF = Buffer.from('GIF89a\u0001\u0000\u0001\u0000\u0000\u0000\u0000;', 'latin1')
  const SVG = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>')

  it('logo: over 1 MB → 413; a GIF or SVG named .png, a PNG named .gif → 415; empty → 422', async () => {
    const logo = (name: string, bytes: Buffer) => post(admin, '/api/admin/agency/logo', multipart([{ name: 'file', value: bytes, fileName: name, type: 'image/png' }]))
    await expectRefusedWithoutTrace(413, () => logo('logo.png', makeLogoPng(96, 48, 1024 * 1024 + 10)), /1 MB/)
    await expectRefusedWithoutTrace(415, () => logo('logo.png', GIF), /PNG/)
    await expectRefusedWithoutTrace(415, () => logo('logo.png', SVG))
    await expectRefusedWithoutTrace(415, () => logo('../../logo.gif', makeLogoPng()))
    await expectRefusedWithoutTrace(422, () => logo('logo.png', Buffer.alloc(0)), /empty/)
  })

  it('certificate: over 64 KB → 413; not PKCS#12, an empty passphrase field, an overlong one → 422', async () => {
    const certificate = (bytes: Buffer, passphrase: string) => post(admin, '/api/admin/agency/certificate', multipart([
      { name: 'passphrase', value: passphrase },
      { name: 'file', value: bytes, fileName: '..\\agency.p12', type: 'application/x-pkcs12' },
    ]))
    await expectRefusedWithoutTrace(413, () => certificate(Buffer.alloc(65 * 1024, 0x30), 'x'), /limit is 64 KB\./)
    await expectRefusedWithoutTrace(422, () => certificate(Buffer.from([0x30, 0x82, 0x01, 0x00, 0x02, 0x01, 0x03]), 'secret'))
    await expectRefusedWithoutTrace(422, () => certificate(Buffer.from('%PDF-1.7 not a certificate'), ''))
    await expectRefusedWithoutTrace(422, () => certificate(Buffer.from([0x30, 0x03, 0x02, 0x01, 0x03]), 'p'.repeat(5000)))
  })
})

describe('POST /api/verify with malformed PDFs: a verdict in words, never 5xx, nothing written', () => {
  const signatureDictionary = (byteRange: string, contents: string) => `%PDF-1.7\n1 0 obj <</Type/Sig/Filter/Adobe.PPKLite/ByteRange[${byteRange}]/Contents<${contents}>>> endobj\n%%EOF\n`
  const cases: Array<[string, string | Buffer]> = [
    ['a byte range past the end of the file', signatureDictionary('0 10 20 99999999', '3003020100')],
    ['a byte range of enormous numbers', signatureDictionary('0 99999999999999999999 99999999999999999999 5', '00')],
    ['a byte range that runs backwards', signatureDictionary('0 50 20 5', '00')],
    ['a signature that is not hexadecimal', '%PDF-1.7\n<</ByteRange[0 9 13 20]/Contents<zz>>>\n%%EOF\n'],
    ['a signature of random DER', signatureDictionary('0 68 90 28', '3082ffff0201')],
    ['only the header', '%PDF-'],
    ['a thousand byte ranges', `%PDF-1.7\n${'<</ByteRange[0 1 2 3]>>\n'.repeat(1000)}%%EOF`],
    ['binary noise after the header', Buffer.concat([Buffer.from('%PDF-1.4\n'), Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 131 + 7) % 256))])],
  ]

  it.each(cases)('%s', async (_label, content) => {
    const mark = await watch.mark()
    const answer = await post(null, '/api/verify', multipart([{ name: 'file', value: Buffer.isBuffer(content) ? content : Buffer.from(content, 'latin1'), fileName: '../../brief.pdf', type: 'application/pdf' }]))
    expect(answerProblems(answer)).toEqual([])
    expect(answer.status, answer.text).toBe(200)
    expect(answer.json).toMatchObject({ signatureValid: false, issuedByTributary: null })
    expect(answer.json.message).toMatch(/^[A-Z].{20,}/)
    expect((await watch.since(mark)).writes).toEqual([])
  })

  it('a file that is not a PDF behind a .pdf name → 422; nothing written', async () => {
    const fake = multipart([{ name: 'file', value: '<html>not a pdf</html>', fileName: 'brief.pdf', type: 'application/pdf' }])
    await expectRefusedWithoutTrace(422, () => post(null, '/api/verify', fake), /not a PDF/)
  })
})
