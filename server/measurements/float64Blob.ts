/**
 * Number series as stored in the measurement tables: little-endian IEEE 754 float64,
 * eight bytes a value, whatever the byte order of the machine that wrote them.
 */
export function toFloat64Blob(values: readonly number[]): Buffer {
  const blob = Buffer.alloc(values.length * 8)
  values.forEach((value, i) => blob.writeDoubleLE(value, i * 8))
  return blob
}

export function fromFloat64Blob(blob: Uint8Array): number[] {
  if (blob.length % 8 !== 0) throw new Error(`a float64 series cannot be ${blob.length} bytes long`)
  const view = new DataView(blob.buffer, blob.byteOffset, blob.length)
  return Array.from({ length: blob.length / 8 }, (_, i) => view.getFloat64(i * 8, true))
}
