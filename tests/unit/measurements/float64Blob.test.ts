import { describe, expect, it } from 'vitest'
import { fromFloat64Blob, toFloat64Blob } from '../../../server/measurements/float64Blob'

describe('float64 series blobs', () => {
  // IEEE 754 binary64: 1.0 is 0x3FF0000000000000 and −2.0 is 0xC000000000000000, written low byte first.
  it('writes little-endian IEEE 754 doubles', () => {
    expect([...toFloat64Blob([1, -2])]).toEqual([0, 0, 0, 0, 0, 0, 0xf0, 0x3f, 0, 0, 0, 0, 0, 0, 0, 0xc0])
  })

  it('reads back every value exactly, also from a view into a larger buffer', () => {
    const values = [0, 850.125, -40, 1e-300, 123456.789]
    const padded = Buffer.concat([Buffer.from([9, 9, 9]), toFloat64Blob(values)])
    expect(fromFloat64Blob(padded.subarray(3))).toEqual(values)
  })

  it('refuses a length that is not a whole number of values', () => {
    expect(() => fromFloat64Blob(new Uint8Array(12))).toThrow('cannot be 12 bytes long')
  })
})
