/**
 * The typefaces of the PDF hold-time sheet. The PDF standard fonts know only WinAnsi
 * (no ≤, ≥, −, Greek or Cyrillic), so the sheet embeds IBM Plex Sans, the pages' own face.
 * @fontsource ships Plex as one WOFF per script (pdfkit reads WOFF), each covering the
 * unicode-range its unicode.json gives. The subsets leave out the comparison signs
 * (≤, ≥ among them), so a character no subset holds is written in DejaVu Sans, the sans
 * face Debian installs beside Chromium, when the system has it.
 */
import { existsSync, readFileSync } from 'node:fs'
import { createRequire } from 'node:module'

export type SheetWeight = 'regular' | 'bold'

export interface SheetFace {
  /** The name the face is registered under in the document. */
  name: string
  data: Buffer
  covers: (codePoint: number) => boolean
}

export interface TextRun {
  face: string
  text: string
}

const PLEX_SUBSETS = ['latin', 'latin-ext', 'greek', 'cyrillic', 'cyrillic-ext', 'vietnamese'] as const
const PLEX_WEIGHTS: Record<SheetWeight, number> = { regular: 400, bold: 600 }
const plexFile = (subset: string, weight: SheetWeight) => `@fontsource/ibm-plex-sans/files/ibm-plex-sans-${subset}-${PLEX_WEIGHTS[weight]}-normal.woff`
const PLEX_RANGES = '@fontsource/ibm-plex-sans/unicode.json'
/** The package files the sheet reads at run time, for the server build to copy beside it (nuxt.config.ts). */
export const SHEET_FONT_FILES = [PLEX_RANGES, ...PLEX_SUBSETS.flatMap((subset) => [plexFile(subset, 'regular'), plexFile(subset, 'bold')])]
const FALLBACK_FILES: Record<SheetWeight, string> = {
  regular: '/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf',
  bold: '/usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf',
}

/** The ranges of a CSS unicode-range value, "U+0000-00FF,U+0131" → [[0, 255], [305, 305]]. */
export function parseUnicodeRange(value: string): [number, number][] {
  return value.split(',').map((part) => {
    const [from, to = from] = part.trim().replace(/^U\+/i, '').split('-')
    return [Number.parseInt(from!, 16), Number.parseInt(to!, 16)]
  })
}

function plexFaces(weight: SheetWeight): SheetFace[] {
  // Made here, not at load: in the server build import.meta.url is only the real entry once the entry has run.
  const require = createRequire(import.meta.url)
  const ranges = JSON.parse(readFileSync(require.resolve(PLEX_RANGES), 'utf8')) as Record<(typeof PLEX_SUBSETS)[number], string>
  return PLEX_SUBSETS.map((subset) => {
    const covered = parseUnicodeRange(ranges[subset])
    return {
      name: `plex-${subset}-${weight}`,
      data: readFileSync(require.resolve(plexFile(subset, weight))),
      covers: (codePoint: number) => covered.some(([from, to]) => codePoint >= from && codePoint <= to),
    }
  })
}

function fallbackFaces(weight: SheetWeight): SheetFace[] {
  const file = FALLBACK_FILES[weight]
  return existsSync(file) ? [{ name: `fallback-${weight}`, data: readFileSync(file), covers: () => true }] : []
}

let loaded: Record<SheetWeight, SheetFace[]> | null = null

/** Plex's subsets in order, then the fallback; read once per process (the files never change while it runs). */
export function sheetFaces(): Record<SheetWeight, SheetFace[]> {
  loaded ??= {
    regular: [...plexFaces('regular'), ...fallbackFaces('regular')],
    bold: [...plexFaces('bold'), ...fallbackFaces('bold')],
  }
  return loaded
}

/**
 * Splits text into runs that one face can write: each character goes to the first face
 * that holds it (Plex before the fallback, so the fallback writes only what Plex lacks),
 * else to the first face, where it would print as the missing-glyph box.
 */
export function textRuns(text: string, faces: readonly SheetFace[]): TextRun[] {
  const runs: TextRun[] = []
  for (const character of text) {
    const codePoint = character.codePointAt(0)!
    const face = (faces.find((candidate) => candidate.covers(codePoint)) ?? faces[0]!).name
    const current = runs.at(-1)
    if (current?.face === face) current.text += character
    else runs.push({ face, text: character })
  }
  return runs.length ? runs : [{ face: faces[0]!.name, text: '' }]
}
