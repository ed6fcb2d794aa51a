/**
 * Reads a table typed one row per line ("27, 60.5, 434"): numbers separated by commas,
 * semicolons or spaces. Each line must hold between `min` and `max` numbers; the message
 * of the first line that does not names it, for the form to show under the input.
 */
export function readNumberLines(text: string, min: number, max: number, what: string): { rows: number[][]; error?: string } {
  const lines = text.split('\n').map((line) => line.trim()).filter(Boolean)
  const rows: number[][] = []
  for (const [i, line] of lines.entries()) {
    const numbers = line.split(/[\s,;]+/).filter(Boolean).map(Number)
    if (numbers.length < min || numbers.length > max || numbers.some((n) => !Number.isFinite(n))) return { rows: [], error: `Line ${i + 1}: write ${what}` }
    rows.push(numbers)
  }
  return { rows }
}
