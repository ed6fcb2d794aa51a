import { describe, expect, it } from 'vitest'
import { parseUnicodeRange, sheetFaces, textRuns, type SheetFace } from '../../../server/records/sheetFonts'

const face = (name: string, covers: (codePoint: number) => boolean): SheetFace => ({ name, data: Buffer.alloc(0), covers })
const latin = face('latin', (c) => c <= 0xff)
const fallback = face('fallback', () => true)

describe('sheet fonts', () => {
  it('reads a CSS unicode-range value (CSS Fonts Level 4, unicode-range: single code points and ranges)', () => {
    expect(parseUnicodeRange('U+0000-00FF,U+0131, U+2212')).toEqual([[0, 255], [0x131, 0x131], [0x2212, 0x2212]])
  })

  it('writes each character in the first face that holds it, so the fallback writes only what Plex lacks', () => {
    expect(textRuns('Mn ≤ 1 %', [latin, fallback])).toEqual([
      { face: 'latin', text: 'Mn ' },
      { face: 'fallback', text: '≤' },
      { face: 'latin', text: ' 1 %' },
    ])
    expect(textRuns('', [latin, fallback])).toEqual([{ face: 'latin', text: '' }])
  })

  it('covers with the shipped Plex subsets what @fontsource lists: ° and µ in latin, Ł in latin-ext, Ω in greek', () => {
    const first = (character: string) => sheetFaces().regular.find((candidate) => candidate.covers(character.codePointAt(0)!))?.name
    expect(['°', 'µ', '—', 'Ł', 'Ω', 'Ж', '≤'].map(first)).toEqual([
      'plex-latin-regular', 'plex-latin-regular', 'plex-latin-regular', 'plex-latin-ext-regular', 'plex-greek-regular', 'plex-cyrillic-regular', 'fallback-regular',
    ])
  })
})
