/**
 * The text shown on the pages of an uncompressed pdfkit PDF, one string per printed line.
 * pdfkit embeds fonts as Type0 with Identity-H: each glyph is a two-byte id in the hex
 * strings of a TJ array, turned back into characters through the font's ToUnicode CMap
 * (the mapping a PDF reader uses for copy and search). A piece set on the previous piece's
 * baseline in another face (a run of a line the sheet writes in several faces) joins its
 * line; table cells of one row share a face and stay apart. Glyph 0 is a font's
 * missing-glyph box: it comes back as U+FFFD, so a test sees a character that did not print.
 */
export const MISSING_GLYPH = '\uFFFD'

function objectBody(source: string, id: string): string {
  const start = source.indexOf(`\n${id} 0 obj`)
  return start < 0 ? '' : source.slice(start, source.indexOf('endobj', start))
}

/** Glyph id → characters, from a ToUnicode CMap's bfrange arrays (`<0000> <0045> [<0000> <004b> …]`). */
function toUnicode(cmap: string): Map<number, string> {
  const glyphs = new Map<number, string>()
  for (const range of cmap.matchAll(/<([0-9a-fA-F]{4})>\s*<[0-9a-fA-F]{4}>\s*\[([^\]]*)\]/g)) {
    const first = Number.parseInt(range[1]!, 16)
    ;[...range[2]!.matchAll(/<([0-9a-fA-F ]*)>/g)].forEach((entry, index) => {
      const units = entry[1]!.split(' ').filter(Boolean).map((unit) => Number.parseInt(unit, 16))
      glyphs.set(first + index, String.fromCharCode(...units))
    })
  }
  return glyphs
}

/** Each font resource name (F1, F2…) with its glyph map. */
function fontMaps(source: string): Map<string, Map<number, string>> {
  const fonts = new Map<string, Map<number, string>>()
  for (const [, name, id] of source.matchAll(/\/(F\d+) (\d+) 0 R/g)) {
    if (fonts.has(name!)) continue
    const cmapId = /\/ToUnicode (\d+) 0 R/.exec(objectBody(source, id!))?.[1]
    fonts.set(name!, cmapId ? toUnicode(objectBody(source, cmapId)) : new Map())
  }
  return fonts
}

export function pdfText(pdf: Buffer): string[] {
  const source = pdf.toString('latin1')
  const fonts = fontMaps(source)
  const lines: string[] = []
  let previous = { y: '', font: '' }
  for (const [, y, font, body] of source.matchAll(/BT\n1 0 0 1 [\d.-]+ ([\d.-]+) Tm\n\/(F\d+) [\d.]+ Tf\n([\s\S]*?)\nET/g)) {
    const glyphs = fonts.get(font!) ?? new Map<number, string>()
    const text = [...body!.matchAll(/<([0-9a-fA-F]*)>/g)]
      .flatMap((piece) => piece[1]!.match(/.{4}/g) ?? [])
      .map((hex) => Number.parseInt(hex, 16))
      .map((glyph) => (glyph === 0 ? MISSING_GLYPH : (glyphs.get(glyph) ?? MISSING_GLYPH)))
      .join('')
    if (y === previous.y && font !== previous.font) lines[lines.length - 1] += text
    else lines.push(text)
    previous = { y: y!, font: font! }
  }
  return lines
}

/** The PostScript names of the fonts embedded in the PDF, without their subset tags ("IBMPlexSans", …). */
export function pdfEmbeddedFonts(pdf: Buffer): string[] {
  const names = [...pdf.toString('latin1').matchAll(/\/FontName \/[A-Z]{6}\+([^\s/]+)/g)].map((match) => match[1]!)
  return [...new Set(names)].sort()
}
