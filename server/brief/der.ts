/**
 * A small DER reader: enough ASN.1 to walk a CMS SignedData and keep the exact bytes of each
 * element (signatures are checked over the bytes as encoded, so re-encoding is not an option).
 * Definite lengths only, as DER requires. Throws `Error('DER: …')` on malformed input.
 */

/** One TLV element. */
export interface DerNode {
  /** 0 universal, 1 application, 2 context-specific, 3 private. */
  tagClass: number
  constructed: boolean
  /** Tag number (low-tag form, < 31, is all CMS uses). */
  tag: number
  /** Offsets in the whole buffer: the element starts at `start`, its value at `valueStart`. */
  start: number
  valueStart: number
  end: number
  /** The whole buffer (use `bytes`/`value` to slice). */
  buffer: Buffer
}

/** Universal tags used here. */
export const TAG = { INTEGER: 2, BIT_STRING: 3, OCTET_STRING: 4, NULL: 5, OID: 6, UTF8_STRING: 12, SEQUENCE: 16, SET: 17, PRINTABLE_STRING: 19, IA5_STRING: 22, UTC_TIME: 23, GENERALIZED_TIME: 24 } as const

/**
 * Reads the element that starts at `offset`.
 *
 * @param buffer - DER bytes
 * @param offset - where the element starts
 * @param limit - end of the enclosing element (default: buffer end)
 */
export function readNode(buffer: Buffer, offset = 0, limit = buffer.length): DerNode {
  if (offset + 2 > limit) throw new Error('DER: truncated header')
  const first = buffer[offset] ?? 0
  const tagClass = first >> 6
  const constructed = (first & 0x20) !== 0
  const tag = first & 0x1F
  if (tag === 0x1F) throw new Error('DER: high tag numbers are not supported')
  let position = offset + 1
  const lengthByte = buffer[position++] ?? 0
  let length = lengthByte
  if (lengthByte & 0x80) {
    const count = lengthByte & 0x7F
    if (count === 0 || count > 4) throw new Error('DER: indefinite or oversized length')
    length = 0
    for (let index = 0; index < count; index++) length = length * 256 + (buffer[position++] ?? 0)
  }
  const end = position + length
  if (end > limit) throw new Error('DER: element runs past its container')
  return { tagClass, constructed, tag, start: offset, valueStart: position, end, buffer }
}

/** The element's children (constructed elements only). */
export function children(node: DerNode): DerNode[] {
  if (!node.constructed) throw new Error('DER: not a constructed element')
  const out: DerNode[] = []
  let offset = node.valueStart
  while (offset < node.end) {
    const child = readNode(node.buffer, offset, node.end)
    out.push(child)
    offset = child.end
  }
  return out
}

/** The whole element's bytes (header included). */
export function bytes(node: DerNode): Buffer {
  return node.buffer.subarray(node.start, node.end)
}

/** The value bytes (header excluded). */
export function value(node: DerNode): Buffer {
  return node.buffer.subarray(node.valueStart, node.end)
}

/** True when the node is universal `tag`. */
export function isUniversal(node: DerNode | undefined, tag: number): node is DerNode {
  return node !== undefined && node.tagClass === 0 && node.tag === tag
}

/** True when the node is context-specific [tag]. */
export function isContext(node: DerNode | undefined, tag: number): node is DerNode {
  return node !== undefined && node.tagClass === 2 && node.tag === tag
}

/**
 * An OBJECT IDENTIFIER in dotted form.
 *
 * @example oidText(readNode(Buffer.from('06092a864886f70d010702', 'hex'))) // '1.2.840.113549.1.7.2'
 */
export function oidText(node: DerNode): string {
  const data = value(node)
  if (data.length === 0) throw new Error('DER: empty OID')
  const parts: number[] = []
  let current = 0
  for (const byte of data) {
    current = current * 128 + (byte & 0x7F)
    if ((byte & 0x80) === 0) {
      parts.push(current)
      current = 0
    }
  }
  const [head = 0, ...rest] = parts
  const firstArc = head < 40 ? 0 : head < 80 ? 1 : 2
  return [firstArc, head - firstArc * 40, ...rest].join('.')
}

/** An INTEGER as upper-case hex without leading zero bytes (certificate serial form). */
export function integerHex(node: DerNode): string {
  let data = value(node)
  while (data.length > 1 && data[0] === 0) data = data.subarray(1)
  return data.toString('hex').toUpperCase()
}

/** UTCTime or GeneralizedTime as a Date (null for other tags or malformed text). */
export function timeValue(node: DerNode): Date | null {
  const text = value(node).toString('latin1')
  const utc = /^(\d{2})(\d{2})(\d{2})(\d{2})(\d{2})(\d{2})?Z$/.exec(text)
  if (node.tag === TAG.UTC_TIME && utc) {
    const year = Number(utc[1])
    return new Date(Date.UTC(year >= 50 ? 1900 + year : 2000 + year, Number(utc[2]) - 1, Number(utc[3]), Number(utc[4]), Number(utc[5]), Number(utc[6] ?? 0)))
  }
  const general = /^(\d{4})(\d{2})(\d{2})(\d{2})(\d{2})(\d{2})?(?:\.\d+)?Z$/.exec(text)
  if (node.tag === TAG.GENERALIZED_TIME && general) {
    return new Date(Date.UTC(Number(general[1]), Number(general[2]) - 1, Number(general[3]), Number(general[4]), Number(general[5]), Number(general[6] ?? 0)))
  }
  return null
}
