import { describe, expect, it } from 'vitest'
import { canonicalJson, recordHash, sha256Hex, verifyRecordHash } from '../../../server/records/canonical'

describe('sha256Hex', () => {
  it.each([
    ['FIPS 180-2 appendix B.1, one block', 'abc', 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'],
    ['FIPS 180-2 appendix B.2, two blocks', 'abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq', '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'],
    ['empty message (NIST example values)', '', 'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855'],
  ])('%s', (_source, message, digest) => {
    expect(sha256Hex(message)).toBe(digest)
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

describe('recordHash and verifyRecordHash', () => {
  const snapshot = {
    loadNumber: 'KB-24-0117',
    events: [
      { type: 'quenched', at: '2026-03-04T09:35:00.000Z', by: 'Tomas Vidal' },
      { type: 'released', at: '2026-03-04T09:55:00.000Z', by: 'June Halvorsen' },
    ],
    planned: { quenchToHandling_s: 979.5, handling_C: 120 },
  }

  it('is the SHA-256 of the canonical text', () => {
    expect(recordHash({ b: 'abc' })).toBe(sha256Hex('{"b":"abc"}'))
    // The bare string "abc" canonicalises to "\"abc\"" (with quotes), not to abc.
    expect(recordHash('abc')).toBe(sha256Hex('"abc"'))
  })

  it('does not depend on key order', () => {
    const reordered = {
      planned: { handling_C: 120, quenchToHandling_s: 979.5 },
      events: snapshot.events.map(({ by, at, type }) => ({ by, at, type })),
      loadNumber: 'KB-24-0117',
    }
    expect(recordHash(reordered)).toBe(recordHash(snapshot))
    expect(verifyRecordHash(reordered, recordHash(snapshot))).toBe(true)
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
    expect(recordHash(copy)).not.toBe(recordHash(snapshot))
    expect(verifyRecordHash(copy, recordHash(snapshot))).toBe(false)
  })

  it('accepts the hash in either case and rejects anything that is not 64 hex digits', () => {
    const hash = recordHash(snapshot)
    expect(verifyRecordHash(snapshot, hash.toUpperCase())).toBe(true)
    expect(verifyRecordHash(snapshot, hash.slice(0, 63))).toBe(false)
    expect(verifyRecordHash(snapshot, 'z'.repeat(64))).toBe(false)
  })
})
