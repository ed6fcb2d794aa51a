/**
 * The text shown on the pages of an uncompressed pdfkit PDF: pdfkit writes each line as
 * a TJ array of hex strings (WinAnsi bytes) with kerning numbers between them, so the
 * pieces of one array are joined and the arrays become lines.
 */
// WinAnsi differs from Latin-1 only in 0x80–0x9F; Node's TextDecoder treats the two alike, so map the ones pdfkit writes for our text.
const WIN_ANSI_HIGH: Record<number, string> = { 0x80: '€', 0x85: '…', 0x91: '‘', 0x92: '’', 0x93: '“', 0x94: '”', 0x95: '•', 0x96: '–', 0x97: '—' }
const winAnsi = (bytes: Buffer) => [...bytes].map((byte) => WIN_ANSI_HIGH[byte] ?? String.fromCharCode(byte)).join('')

export function pdfText(pdf: Buffer): string[] {
  const source = pdf.toString('latin1')
  const lines: string[] = []
  for (const match of source.matchAll(/\[((?:<[0-9a-fA-F]*>|\s|-?[\d.]+)*)\]\s*TJ/g)) {
    const pieces = [...match[1]!.matchAll(/<([0-9a-fA-F]*)>/g)].map((piece) => winAnsi(Buffer.from(piece[1]!, 'hex')))
    lines.push(pieces.join(''))
  }
  return lines
}
