/**
 * Canonical serialisation and the keyed seal of a record snapshot, so a signed record
 * can be checked later for tampering: the same content always gives the same bytes,
 * whatever order its keys were built in. Rules: object keys sorted by UTF-16 code units (as
 * Array.prototype.sort does), no whitespace, strings and numbers exactly as
 * JSON.stringify writes them (-0 becomes 0), undefined object members left out.
 * Non-finite numbers, undefined array items and values JSON has no form for are
 * refused rather than silently changed, since a hash over a lossy form proves little.
 */
import { createHmac, timingSafeEqual } from 'node:crypto'

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

/** Hex HMAC-SHA-256 (RFC 2104) of the UTF-8 text under the key. */
export function hmacSha256Hex(key: string | Buffer, text: string): string {
  return createHmac('sha256', key).update(text, 'utf8').digest('hex')
}

/** A usable seal key: a secret of at least 32 characters. */
export function isSealKey(key: unknown): key is string {
  return typeof key === 'string' && key.length >= 32
}

/**
 * The record's seal: HMAC-SHA-256 of the snapshot's canonical JSON under the shop's
 * seal key. A plain hash could be recomputed by anyone who can edit the database; the
 * seal cannot without the key, which lives with the server, not in the database.
 */
export function recordSeal(snapshot: unknown, key: string | Buffer): string {
  return hmacSha256Hex(key, canonicalJson(snapshot))
}

/** True when the snapshot still carries the seal `expectedHex` under the key (compared in constant time). */
export function verifyRecordSeal(snapshot: unknown, expectedHex: string, key: string | Buffer): boolean {
  if (!/^[0-9a-f]{64}$/i.test(expectedHex)) return false
  const actual = Buffer.from(recordSeal(snapshot, key), 'hex')
  return timingSafeEqual(actual, Buffer.from(expectedHex, 'hex'))
}
