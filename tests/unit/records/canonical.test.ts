import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { canonicalJson, hmacSha256Hex, recordSeal, verifyRecordSeal } from '../../../server/records/canonical'

describe('hmacSha256Hex', () => {
  it.each([
    ['RFC 4231 test case 1', Buffer.alloc(20, 0x0b), 'Hi There', 'b0344c61d8db38535ca8afceaf0bf12b881dc200c9833da726e9376c2e32cff7'],
    ['RFC 4231 test case 2 (key shorter than the output)', 'Jefe', 'what do ya want for nothing?', '5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843'],
    ['RFC 4231 test case 6 (key longer than a block)', Buffer.alloc(131, 0xaa), 'Test Using Larger Than Block-Size Key - Hash Key First', '60e431591ee0b67f0d8a26aacbf5b77f8e0bc6213728c5140546040f0ee37f54'],
  ])('%s', (_source, key, message, digest) => {
    expect(hmacSha256Hex(key, message)).toBe(digest)
  })
})

describe('canonicalJson', () => {
  it('sorts keys at every depth and writes no whitespace', () => {
    expect(canonicalJson({ b: 1, a: { d: [3, { z: true, y: null }], c: 'x' } })).toBe('{"a":{"c":"x","d":[3,{"y":null,"z":true}]},"b":1}')
  })

  it('writes numbers as JSON numbers: no quotes, shortest form, -0 as 0', () => {
    expect(canonicalJson({ n: [1.5, 100, 1e21, -0, 0.1 + 0.2] })).toBe('{"n":[1.5,100,1e+21,0,0.30000000000000004]}')
  })

  it('escapes strings as JSON does and keeps non-ASCII text as is', () => {
    expect(canonicalJson({ note: 'core "hot"\n850 °C' })).toBe('{"note":"core \\"hot\\"\\n850 °C"}')
  })

  it('leaves out undefined members and writes dates as ISO strings', () => {
    expect(canonicalJson({ a: undefined, at: new Date('2026-03-04T09:35:00Z') })).toBe('{"at":"2026-03-04T09:35:00.000Z"}')
  })

  it.each([
    ['NaN', { t: Number.NaN }, /\$\.t/],
    ['Infinity in an array', { t: [1, Infinity] }, /\$\.t\[1\]/],
    ['undefined array item', { t: [undefined] }, /\$\.t\[0\]/],
    ['a Map', { m: new Map() }, /\$\.m: only plain objects/],
    ['a bigint', { b: 1n }, /\$\.b: a bigint/],
  ])('refuses %s and names where it is', (_what, value, message) => {
    expect(() => canonicalJson(value)).toThrow(message)
  })
})

describe('recordSeal and verifyRecordSeal', () => {
  const key = 'a-seal-key-of-at-least-thirty-two-characters'
  const snapshot = {
    loadNumber: 'KB-24-0117',
    events: [
      { type: 'quenched', at: '2026-03-04T09:35:00.000Z', by: 'Tomas Vidal' },
      { type: 'released', at: '2026-03-04T09:55:00.000Z', by: 'June Halvorsen' },
    ],
    planned: { quenchToHandling_s: 979.5, handling_C: 120 },
  }

  it('is the HMAC-SHA-256 of the canonical text under the key', () => {
    expect(recordSeal({ b: 'abc' }, key)).toBe(hmacSha256Hex(key, '{"b":"abc"}'))
    // The bare string "abc" canonicalises to "\"abc\"" (with quotes), not to abc.
    expect(recordSeal('abc', key)).toBe(hmacSha256Hex(key, '"abc"'))
  })

  it('cannot be reproduced without the key: another key, or a plain SHA-256 of the same text, is refused', () => {
    const seal = recordSeal(snapshot, key)
    expect(verifyRecordSeal(snapshot, seal, key)).toBe(true)
    expect(verifyRecordSeal(snapshot, seal, `${key}!`)).toBe(false)
    expect(verifyRecordSeal(snapshot, recordSeal(snapshot, 'another-key-of-at-least-thirty-two-chars'), key)).toBe(false)
    expect(verifyRecordSeal(snapshot, createHash('sha256').update(canonicalJson(snapshot)).digest('hex'), key)).toBe(false)
  })

  it('does not depend on key order', () => {
    const reordered = {
      planned: { handling_C: 120, quenchToHandling_s: 979.5 },
      events: snapshot.events.map(({ by, at, type }) => ({ by, at, type })),
      loadNumber: 'KB-24-0117',
    }
    expect(recordSeal(reordered, key)).toBe(recordSeal(snapshot, key))
    expect(verifyRecordSeal(reordered, recordSeal(snapshot, key), key)).toBe(true)
  })

  it.each([
    ['a number', (s: any) => { s.planned.handling_C = 121 }],
    ['a number by its smallest step', (s: any) => { s.planned.quenchToHandling_s = 979.5000000000001 }],
    ['a number into the same-looking string', (s: any) => { s.planned.handling_C = '120' }],
    ['an event time by one millisecond', (s: any) => { s.events[1].at = '2026-03-04T09:55:00.001Z' }],
    ['who recorded an event', (s: any) => { s.events[0].by = 'Someone Else' }],
    ['the order of events', (s: any) => { s.events.reverse() }],
    ['an added member', (s: any) => { s.signedBy = 'June Halvorsen' }],
  ])('changes when %s changes', (_what, tamper) => {
    const copy = structuredClone(snapshot)
    tamper(copy)
    expect(recordSeal(copy, key)).not.toBe(recordSeal(snapshot, key))
    expect(verifyRecordSeal(copy, recordSeal(snapshot, key), key)).toBe(false)
  })

  it('accepts the seal in either case and rejects anything that is not 64 hex digits', () => {
    const seal = recordSeal(snapshot, key)
    expect(verifyRecordSeal(snapshot, seal.toUpperCase(), key)).toBe(true)
    expect(verifyRecordSeal(snapshot, seal.slice(0, 63), key)).toBe(false)
    expect(verifyRecordSeal(snapshot, 'z'.repeat(64), key)).toBe(false)
  })
})
