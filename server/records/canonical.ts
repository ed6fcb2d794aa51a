/**
 * Canonical serialisation and SHA-256 of a record snapshot, so a signed record can be
 * checked later for tampering: the same content always gives the same bytes, whatever
 * order its keys were built in. Rules: object keys sorted by UTF-16 code units (as
 * Array.prototype.sort does), no whitespace, strings and numbers exactly as
 * JSON.stringify writes them (-0 becomes 0), undefined object members left out.
 * Non-finite numbers, undefined array items and values JSON has no form for are
 * refused rather than silently changed, since a hash over a lossy form proves little.
 */
import { createHash, timingSafeEqual } from 'node:crypto'

export function canonicalJson(value: unknown): string {
  return write(value, '$')
}

function write(value: unknown, path: string): string {
  if (value === null) return 'null'
  switch (typeof value) {
    case 'string':
    case 'boolean':
      return JSON.stringify(value)
    case 'number':
      if (!Number.isFinite(value)) throw new TypeError(`${path}: ${value} has no JSON form`)
      return JSON.stringify(value)
    case 'object': {
      if (value instanceof Date) return JSON.stringify(value.toISOString())
      if (Array.isArray(value)) {
        return `[${value.map((item, index) => {
          if (item === undefined) throw new TypeError(`${path}[${index}]: undefined has no JSON form`)
          return write(item, `${path}[${index}]`)
        }).join(',')}]`
      }
      const prototype = Object.getPrototypeOf(value)
      if (prototype !== Object.prototype && prototype !== null) {
        throw new TypeError(`${path}: only plain objects, arrays, dates and primitives can be hashed`)
      }
      const members = Object.keys(value)
        .filter((key) => (value as Record<string, unknown>)[key] !== undefined)
        .sort()
        .map((key) => `${JSON.stringify(key)}:${write((value as Record<string, unknown>)[key], `${path}.${key}`)}`)
      return `{${members.join(',')}}`
    }
    default:
      throw new TypeError(`${path}: a ${typeof value} has no JSON form`)
  }
}

export function sha256Hex(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex')
}

/** Hex SHA-256 of the snapshot's canonical JSON. */
export function recordHash(snapshot: unknown): string {
  return sha256Hex(canonicalJson(snapshot))
}

/** True when the snapshot still hashes to `expectedHex` (compared in constant time). */
export function verifyRecordHash(snapshot: unknown, expectedHex: string): boolean {
  if (!/^[0-9a-f]{64}$/i.test(expectedHex)) return false
  const actual = Buffer.from(recordHash(snapshot), 'hex')
  return timingSafeEqual(actual, Buffer.from(expectedHex, 'hex'))
}
