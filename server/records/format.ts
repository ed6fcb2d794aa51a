/** Number and time formatting shared by the sheet renderers, so HTML, PDF and CSV agree. */
/** A span for people: "1 h 05 min", "4 min 10 s", "45 s". */
export function formatSpan(s: number): string {
  const total = Math.round(s)
  const h = Math.floor(total / 3600)
  const m = Math.floor((total % 3600) / 60)
  const rest = total % 60
  if (h > 0) return `${h} h ${String(m).padStart(2, '0')} min`
  if (m > 0) return `${m} min ${String(rest).padStart(2, '0')} s`
  return `${rest} s`
}

/** "2026-03-04 07:12:05 UTC": the sheets are read in several time zones, so UTC, said so. */
export function formatInstant(iso: string): string {
  const date = new Date(iso)
  if (Number.isNaN(date.getTime())) return iso
  return `${date.toISOString().slice(0, 19).replace('T', ' ')} UTC`
}

export function formatTemperature(T_C: number): string {
  return `${T_C.toFixed(0)} °C`
}
