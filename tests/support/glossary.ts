import { readFileSync } from 'node:fs'

/**
 * The retired words of the glossary in DEVELOPERS.md: the backticked entries in the
 * last column of its "Retired words" table. The guide is the one list; tests read it from there.
 */
export function retiredWords(): string[] {
  const guide = readFileSync('DEVELOPERS.md', 'utf8')
  const section = guide.split('### Retired words')[1]?.split('\n#')[0]
  if (!section) throw new Error('DEVELOPERS.md has no "Retired words" table in its glossary')
  const rows = section.split('\n').filter((line) => line.startsWith('| ') && !line.startsWith('| Say'))
  return rows.flatMap((row) => [...(row.split('|').at(-2) ?? '').matchAll(/`([^`]+)`/g)].map((match) => match[1]!))
}

/** The retired words found in `text` (case-insensitive, at the start of a word, so "Withdraw" also finds "withdrawal"). */
export function retiredWordsIn(text: string, words = retiredWords()): string[] {
  return words.filter((word) => new RegExp(`\\b${word.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`, 'i').test(text))
}
