/**
 * fast-check generators of hostile request parts: address parameters, query strings, JSON
 * bodies (wrong types, missing and extra fields, deep nesting, huge strings, prototype keys,
 * broken JSON) and multipart uploads (path tricks in file names, contents of the wrong kind,
 * broken framing). Nothing generated contains text that `INTERNAL_DETAIL` looks for, so an
 * answer that echoes the input is never mistaken for a leak.
 */
import fc from 'fast-check'
import { INTERNAL_DETAIL } from './fuzz-http'

/** What a route's generated requests may build on: real ids per parameter, learned body fields. */
export interface RouteKnowledge {
  /** real ids (as text) per parameter name, so some requests get past the address check */
  realIds: Record<string, string[]>
  /** dotted field paths the route named when sent `{}` (and nested `{}`) */
  fields: string[]
  /** the route reads multipart uploads rather than JSON */
  multipart: boolean
  /** a body the route accepted (or the closest found) to break one field at a time */
  example: Record<string, unknown>
}

/** A generated request, before it becomes bytes. */
export interface FuzzCase {
  /** encoded address segment per parameter */
  params: Record<string, string>
  /** '' or '?a=b&…' */
  query: string
  body?: { contentType?: string, bytes: Buffer, label: string }
}

const echoSafe = (text: string) => !INTERNAL_DETAIL.test(text)

/** Strings chosen by hand: path tricks, encodings, injection attempts, number lookalikes. */
const TRICKY_TEXT = [
  '', ' ', '.', '..', '../../etc/passwd', '..\\..\\windows\\win.ini', 'C:\\Windows\\system.ini', '/etc/shadow',
  '\u0000', 'a\u0000b', '%00', '%2e%2e%2f', '\u202Egpj.exe', '\uFEFFbom', '𝕏𝕪𝕫', '🦎🦎🦎', 'Ωmega ≈ ç √', 'ｆｕｌｌｗｉｄｔｈ',
  '١٢٣', '１２', '<script>alert(1)</script>', '" onmouseover="x', '\' or \'1\'=\'1', '1; drop table users; --',
  '${7*7}', '{{7*7}}', '__proto__', 'constructor', 'prototype', 'null', 'undefined', 'NaN', 'Infinity', '-Infinity',
  '-1', '0', '-0', '1.5', '1e309', '0x1F', '9'.repeat(40), '\r\n', '\t', 'true', '[]', '{}', '%s%n%x', '\\u0000',
  'CON', 'nul.txt', 'x'.repeat(300), 'ñ'.repeat(4000), '2025-02-30', '2025-13-01T25:61:00Z', '+12', ' 42 ', '4 2',
]

/** Any text: hand-picked tricks, short random unicode, occasionally very long. */
export const hostileText: fc.Arbitrary<string> = fc.oneof(
  { arbitrary: fc.constantFrom(...TRICKY_TEXT), weight: 4 },
  { arbitrary: fc.string({ unit: 'binary', maxLength: 24 }), weight: 3 },
  { arbitrary: fc.string({ unit: 'grapheme', maxLength: 12 }), weight: 2 },
  { arbitrary: fc.tuple(fc.constantFrom('x', 'é', '🦎', '\u0000'), fc.constantFrom(5_000, 40_000, 200_000)).map(([unit, n]) => unit.repeat(n)), weight: 1 },
).filter(echoSafe)

/** Numbers at the edges of what JSON, JavaScript and PostgreSQL integers hold. */
const edgeNumber = fc.oneof(
  fc.constantFrom(0, -0, -1, 1, 0.5, -0.5, 2_147_483_647, 2_147_483_648, -2_147_483_649, Number.MAX_SAFE_INTEGER, Number.MAX_SAFE_INTEGER + 2, 1e21, 1e308, -1e308, 5e-324, 1e-7),
  fc.integer({ min: -5, max: 60 }),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
)

/** A value of any JSON kind, scalars weighted towards the tricky. */
export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { arbitrary: hostileText, weight: 3 },
  { arbitrary: edgeNumber, weight: 3 },
  { arbitrary: fc.constantFrom(true, false, null, [], {}, [null], [[]], { '': '' }), weight: 2 },
  { arbitrary: fc.array(fc.oneof(edgeNumber, hostileText), { maxLength: 6 }), weight: 1 },
  { arbitrary: fc.constantFrom(Array.from({ length: 5000 }, (_, i) => i), Array.from({ length: 300 }, () => 'x'.repeat(100))), weight: 1 },
  { arbitrary: fc.dictionary(fc.constantFrom('type', 'coordinates', 'value', 'done', 'name', 'year', '__proto__'), fc.oneof(edgeNumber, hostileText), { maxKeys: 3 }), weight: 1 },
  { arbitrary: fc.jsonValue({ maxDepth: 3 }), weight: 2 },
)

/** Values that fit common field types, so some bodies get past the type checks to the rules behind them. */
const plausibleValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.integer({ min: -3, max: 40 }),
  fc.constantFrom('Test value', 'person@example.org', '2024-05-01', 'microsatellite', 'csv', 'approve', 'draft', 'quarterly', true, false, null),
  fc.constant([1, 2]),
)

/** Sets `value` at a dotted path inside `target`, making objects on the way. */
function setPath(target: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.').filter(key => key !== '')
  let node: Record<string, unknown> = target
  keys.forEach((key, index) => {
    if (index === keys.length - 1) {
      Object.defineProperty(node, key, { value, enumerable: true, writable: true, configurable: true })
      return
    }
    const next = Object.prototype.hasOwnProperty.call(node, key) ? node[key] : undefined
    if (next === null || typeof next !== 'object' || Array.isArray(next)) {
      const created: Record<string, unknown> = {}
      Object.defineProperty(node, key, { value: created, enumerable: true, writable: true, configurable: true })
      node = created
    } else {
      node = next as Record<string, unknown>
    }
  })
}

/** Keys that try to reach Object.prototype, as JSON text (JSON.parse makes them own properties). */
const PROTOTYPE_KEYS = [
  '{"__proto__":{"role":"administrator","isAdmin":true,"agencyId":1}}',
  '{"constructor":{"prototype":{"polluted":true,"role":"administrator"}}}',
  '{"__proto__":null}',
  '{"toString":"x","valueOf":1,"hasOwnProperty":"no"}',
]

/** Optional fields a route may not name when sent `{}` (learning sees required ones only) where deep values matter. */
const DEEP_FIELD_NAMES = ['geometry', 'inputs', 'narrative', 'checklist']

/** Nesting thousands of levels deep, inside a field the route knows (or at the top). */
function deepNesting(field: string | undefined, depth: number, kind: 'array' | 'object' | 'geometry'): string {
  const open = kind === 'object' ? '{"a":'.repeat(depth) : '['.repeat(depth)
  const close = kind === 'object' ? '}'.repeat(depth) : ']'.repeat(depth)
  const innermost = `${open}1${close}`
  // GeoJSON-shaped, so checks that look at `type` before the coordinates are reached too
  const nested = kind === 'geometry' ? `{"type":"Polygon","coordinates":${innermost}}` : innermost
  return field ? `{${JSON.stringify(field.split('.')[0])}:${nested}}` : nested
}

/** Text that is not valid JSON, or JSON that JavaScript reads oddly (1e999 → Infinity). */
const BROKEN_JSON = [
  '{', '{"a":', '{"a":1,}', '[1,2', '"unterminated', 'nul', '{a:1}', '{"a":1}{"b":2}', '\uFEFF{}', '{"a":1e999}', '{"version":-1e999}',
  '{"id":1e999,"version":1e999}', '{"a":"\\ud800"}', '{"a":"\\u0000"}', '{"__proto__":', '\u0000', '<xml/>', '=&=&',
]

/** A JSON body for a route with known fields. */
export function jsonBody(knowledge: RouteKnowledge): fc.Arbitrary<NonNullable<FuzzCase['body']>> {
  const learned = [...new Set([...Object.keys(knowledge.example), ...knowledge.fields])]
  const fields = learned.length > 0 ? learned : ['name', 'id', 'version']
  const shaped = fc.tuple(
    fc.subarray(fields),
    fc.array(fc.oneof(hostileValue, plausibleValue), { minLength: fields.length, maxLength: fields.length }),
    fc.dictionary(fc.oneof(hostileText.filter(key => key.length < 200), fc.constantFrom('__proto__', 'constructor', 'id', 'agencyId', 'role', 'createdBy', 'status', 'deletedAt')), hostileValue, { maxKeys: 2 }),
  ).map(([chosen, values, extra]) => {
    const body: Record<string, unknown> = {}
    chosen.forEach((path, index) => setPath(body, path, values[index]))
    for (const [key, value] of Object.entries(extra)) setPath(body, key.replace(/\./g, '_'), value)
    return { text: JSON.stringify(body), label: 'fields with hostile values' }
  })
  const example = JSON.stringify(knowledge.example)
  const nearValid = fc.tuple(
    fc.subarray(fields, { minLength: 1, maxLength: Math.min(2, fields.length) }),
    fc.array(fc.oneof(hostileValue, plausibleValue, fc.constant(undefined)), { minLength: 2, maxLength: 2 }),
    fc.option(fc.tuple(fc.constantFrom('__proto__', 'constructor', 'agencyId', 'id', 'createdBy', 'extra'), hostileValue), { nil: undefined }),
  ).map(([chosen, values, extra]) => {
    const body = JSON.parse(example) as Record<string, unknown>
    chosen.forEach((path, index) => setPath(body, path, values[index]))
    if (extra) setPath(body, extra[0], extra[1])
    return { text: JSON.stringify(body), label: `a learned body with ${chosen.join(', ')} changed` }
  })
  const anyJson = fc.oneof(hostileValue, fc.jsonValue({ maxDepth: 4 })).map(value => ({ text: JSON.stringify(value) ?? 'null', label: 'any JSON value' }))
  const prototype = fc.tuple(fc.constantFrom(...PROTOTYPE_KEYS), fc.subarray(fields), plausibleValue).map(([text, chosen, value]) => {
    const merged = JSON.parse(text) as Record<string, unknown>
    for (const path of chosen) setPath(merged, path, value)
    return { text: JSON.stringify(merged), label: 'prototype keys' }
  })
  const deep = fc.tuple(fc.option(fc.constantFrom(...fields, ...DEEP_FIELD_NAMES), { nil: undefined }), fc.constantFrom(50, 2000, 20_000), fc.constantFrom('array' as const, 'object' as const, 'geometry' as const))
    .map(([field, depth, kind]) => ({ text: deepNesting(field, depth, kind), label: `nesting ${depth} deep` }))
  const broken = fc.constantFrom(...BROKEN_JSON).map(text => ({ text, label: 'broken JSON' }))
  const huge = fc.tuple(fc.constantFrom(...fields), fc.constantFrom(70_000, 300_000, 300_000, 2_200_000)).map(([field, n]) => {
    const body: Record<string, unknown> = {}
    setPath(body, field, 'y'.repeat(n))
    return { text: JSON.stringify(body), label: `a ${n}-character string` }
  })
  const contentType = fc.oneof(
    { arbitrary: fc.constant('application/json'), weight: 12 },
    { arbitrary: fc.constantFrom(undefined, 'text/plain', 'application/json; charset=utf-16', 'application/x-www-form-urlencoded', 'multipart/form-data', 'text/csv', 'application/xml', '*/*'), weight: 1 },
  )
  return fc.tuple(
    fc.oneof(
      { arbitrary: nearValid, weight: 6 },
      { arbitrary: shaped, weight: 4 },
      { arbitrary: anyJson, weight: 2 },
      { arbitrary: prototype, weight: 1 },
      { arbitrary: deep, weight: 1 },
      { arbitrary: broken, weight: 1 },
      { arbitrary: huge, weight: 1 },
    ),
    contentType,
  ).map(([{ text, label }, type]) => ({ contentType: type, bytes: Buffer.from(text, 'utf8'), label }))
}

/** File names that try to climb out of folders, hide their ending or break headers. */
const TRICKY_FILE_NAMES = [
  '../../etc/passwd', '..\\..\\boot.ini', 'C:\\Users\\ann\\permit.pdf', '/etc/passwd.csv', 'report\u0000.pdf.exe', 'evil.php\u0000.png',
  'a'.repeat(1000) + '.csv', `${'é'.repeat(300)}.txt`, 'рапорт.pdf', '報告.csv', '🦎 count.csv', 'line\r\nInjected: yes.txt',
  'quote".pdf', 'semi;colon=1.png', '.hidden', '..', '.', '', ' ', 'CON.csv', 'nul.txt', 'noending', 'double..dots..csv',
  'file.CSV', 'file.Pdf', 'file.pdf.', 'file.pdf ', '%2e%2e%2fpasswd.csv', 'data.vcf', 'data.geojson', 'cert.p12', 'logo.jpeg',
]

/** File contents of the right and wrong kinds, broken in typical ways. */
const FILE_CONTENTS: Array<{ label: string, bytes: Buffer }> = [
  { label: 'empty', bytes: Buffer.alloc(0) },
  { label: 'PDF header only', bytes: Buffer.from('%PDF-1.7\n') },
  { label: 'PDF with a broken signature dictionary', bytes: Buffer.from('%PDF-1.7\n1 0 obj <</Type/Sig/ByteRange[0 99999999 99999999 5]/Contents<zz>>> endobj\n%%EOF') },
  { label: 'PNG signature then garbage', bytes: Buffer.concat([Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]), Buffer.from('garbage')]) },
  { label: 'JPEG start then garbage', bytes: Buffer.from([0xFF, 0xD8, 0xFF, 0x00, 0x01]) },
  { label: 'zip header only', bytes: Buffer.from([0x50, 0x4B, 0x03, 0x04, 0, 0]) },
  { label: 'CSV with mismatched columns', bytes: Buffer.from('individual,locus1_a,locus1_b\nA1,120\nA2,122,124,999\n') },
  { label: 'CSV with quotes left open', bytes: Buffer.from('year,count\n"2020,12\n2021,"1e999"\n') },
  { label: 'CSV header only', bytes: Buffer.from('year,count,method\n') },
  { label: 'CSV with formulas and NUL', bytes: Buffer.from('year,count\n=cmd|calc,@SUM(A1)\n2020,\u0000\n') },
  { label: 'VCF header without samples', bytes: Buffer.from('##fileformat=VCFv4.2\n#CHROM\tPOS\tID\tREF\tALT\tQUAL\tFILTER\tINFO\tFORMAT\n') },
  { label: 'VCF with broken genotypes', bytes: Buffer.from('##fileformat=VCFv4.2\n#CHROM\tPOS\tID\tREF\tALT\tQUAL\tFILTER\tINFO\tFORMAT\tS1\n1\t10\t.\tA\tG,T\t.\t.\t.\tGT\t0/5\n1\tx\t.\tA\tG\t.\t.\t.\tGT\t./.|\n') },
  { label: 'GeoJSON with a ring of two points', bytes: Buffer.from('{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"name":"x"},"geometry":{"type":"Polygon","coordinates":[[[0,0],[1,1]]]}}]}') },
  { label: 'GeoJSON nested very deep', bytes: Buffer.from(`{"type":"Feature","geometry":{"type":"Polygon","coordinates":${'['.repeat(3000)}${']'.repeat(3000)}}}`) },
  { label: 'PKCS#12 lookalike', bytes: Buffer.from([0x30, 0x82, 0x01, 0x00, 0x02, 0x01, 0x03, 0x30]) },
  { label: 'binary noise', bytes: Buffer.from(Array.from({ length: 256 }, (_, i) => (i * 73 + 11) % 256)) },
  { label: 'invalid UTF-8', bytes: Buffer.from([0xC3, 0x28, 0xA0, 0xA1, 0xE2, 0x28, 0xA1, 0xF0, 0x28, 0x8C, 0xBC]) },
]

function multipartPart(boundary: string, name: string, value: Buffer, fileName?: string, type?: string): Buffer {
  const nameParam = fileName === undefined ? '' : `; filename="${fileName.replace(/"/g, '%22')}"`
  const typeLine = type ? `Content-Type: ${type}\r\n` : ''
  return Buffer.concat([Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${name}"${nameParam}\r\n${typeLine}\r\n`, 'utf8'), value, Buffer.from('\r\n')])
}

/** A multipart upload body: one (or no, or two) file with a tricky name and contents, odd text fields, sometimes broken framing. */
export function multipartBody(fieldNames: readonly string[]): fc.Arbitrary<NonNullable<FuzzCase['body']>> {
  const boundary = 'fuzz-boundary-7e3a'
  const textFields = fc.dictionary(fc.constantFrom(...fieldNames, 'passphrase', 'markerType', 'sampledYear', 'file', 'extra'), hostileText.filter(text => text.length < 5000), { maxKeys: 3 })
  const file = fc.record({
    name: fc.oneof(fc.constantFrom(...TRICKY_FILE_NAMES), hostileText.map(text => `${text.slice(0, 200)}.csv`)),
    content: fc.oneof(
      { arbitrary: fc.constantFrom(...FILE_CONTENTS), weight: 4 },
      { arbitrary: fc.uint8Array({ maxLength: 512 }).map(bytes => ({ label: 'random bytes', bytes: Buffer.from(bytes) })), weight: 1 },
    ),
    type: fc.constantFrom(undefined, 'text/csv', 'application/pdf', 'image/png', 'application/octet-stream', 'text/html', '../evil'),
    copies: fc.constantFrom(1, 1, 1, 1, 0, 2),
    field: fc.constantFrom('file', 'file', 'file', 'upload', ''),
  })
  const framing = fc.constantFrom('well-formed', 'well-formed', 'well-formed', 'no closing boundary', 'no boundary parameter', 'garbage')
  return fc.tuple(textFields, file, framing).map(([fields, chosen, how]) => {
    const parts = Object.entries(fields).map(([name, value]) => multipartPart(boundary, name, Buffer.from(value, 'utf8')))
    for (let copy = 0; copy < chosen.copies; copy++) parts.push(multipartPart(boundary, chosen.field, chosen.content.bytes, chosen.name, chosen.type))
    const closing = how === 'no closing boundary' ? Buffer.alloc(0) : Buffer.from(`--${boundary}--\r\n`)
    const bytes = how === 'garbage' ? Buffer.from('--x\r\nnot a part\r\n\r\n') : Buffer.concat([...parts, closing])
    const contentType = how === 'no boundary parameter' ? 'multipart/form-data' : `multipart/form-data; boundary=${boundary}`
    return { contentType, bytes, label: `multipart (${how}): ${chosen.copies} × ${chosen.content.label} as ${JSON.stringify(chosen.name.slice(0, 60))}` }
  })
}

/** Numbers and words that look like ids but are not valid ones. */
const NOT_QUITE_IDS = ['0', '-1', '-0', '01', '2147483648', '99999999999999999999', '1e3', '0x10', '1.5', ' 1', '1 ', '+1', '１２', 'NaN', 'Infinity', '1,2', '1;2', '[1]']

/** Encodes text for one address segment; '.' and '..' go as they are, to try the path itself. */
export function encodeSegment(text: string): string {
  if (text === '.' || text === '..') return text
  return encodeURIComponent(text.replace(/[\uD800-\uDFFF]/g, '\uFFFD'))
}

/** One address parameter: real ids of the right table often, anything else otherwise. */
export function paramValue(realIds: readonly string[]): fc.Arbitrary<string> {
  const options: Array<fc.WeightedArbitrary<string>> = [
    { arbitrary: fc.integer({ min: 1, max: 40 }).map(String), weight: 2 },
    { arbitrary: fc.constantFrom(...NOT_QUITE_IDS), weight: 2 },
    { arbitrary: hostileText.filter(text => text.length < 1000), weight: 3 },
  ]
  if (realIds.length > 0) options.push({ arbitrary: fc.constantFrom(...realIds), weight: 4 })
  return fc.oneof(...options).map(encodeSegment)
}

/** Query parameter names the routes use, plus names that try to reach prototypes. */
const QUERY_KEYS = [
  'page', 'status', 'version', 'speciesId', 'redirect', 'download', 'info', 'mode', 'mine', 'recipientId', 'from', 'to', 'action',
  'actorId', 'entityType', 'entityId', 'limit', 'markerType', 'proposalId', 'scenarioId', '__proto__', 'constructor[prototype][x]',
  '__proto__[role]', 'page[]', 'a[b][c]',
]

/** A query string: known and unknown keys, repeated keys, hostile values. */
export const queryString: fc.Arbitrary<string> = fc.array(
  fc.tuple(
    fc.oneof({ arbitrary: fc.constantFrom(...QUERY_KEYS), weight: 4 }, { arbitrary: hostileText.filter(text => text.length < 100), weight: 1 }),
    fc.oneof(
      { arbitrary: fc.constantFrom('0', '1', '2', 'true', 'false', 'draft', 'approve', 'replace', 'append', '2024-01-01', '1', '0'), weight: 3 },
      { arbitrary: fc.constantFrom(...NOT_QUITE_IDS), weight: 1 },
      { arbitrary: hostileText.filter(text => text.length < 400), weight: 2 },
    ),
  ),
  { maxLength: 4 },
).map(pairs => (pairs.length === 0 ? '' : `?${pairs.map(([key, value]) => `${encodeSegment(key)}=${encodeSegment(value)}`).join('&')}`))
