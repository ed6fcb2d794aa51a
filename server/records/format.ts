/** Number and time formatting shared by the sheet renderers, so HTML, PDF and CSV agree. */
import { RECORD_EVENT_LABELS, type HoldTimeSheet, type RecordEvent, type RecordEventType } from '../../shared/types/records'

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

const measuredOrNot = (s: number | null) => (s === null ? 'not recorded' : formatSpan(s))

/** The sheet's span table (span, planned, recorded), the same rows in HTML, PDF and text. */
export function spanRows(sheet: Pick<HoldTimeSheet, 'planned' | 'measured' | 'notRecorded'>): [string, string, string][] {
  const { planned, measured } = sheet
  const doorMissing = sheet.notRecorded.includes('furnace_opened')
  return [
    ['Heat-up (charge to core at heat)', planned.heatUp_s === null ? 'not planned' : `predicted ${formatSpan(planned.heatUp_s)}`, measuredOrNot(measured.heatUp_s)],
    ['Soak', planned.minimumSoak_s === null ? 'not planned' : `at least ${formatSpan(planned.minimumSoak_s)}`, measuredOrNot(measured.soak_s)],
    ['Quench delay (furnace door to quench)', `at most ${formatSpan(planned.quenchDelayAllowance_s)}`, doorMissing ? 'not measured: door opening not recorded' : measuredOrNot(measured.quenchDelay_s)],
    [`Quench to release (handling below ${formatTemperature(planned.handling_C)})`, `predicted ${formatSpan(planned.quenchToHandling_s)}`, measuredOrNot(measured.quenchToRelease_s)],
  ]
}

/** "When" of an event: predicted moments say so, so they never read as floor entries. */
export function eventWhen(event: RecordEvent): string {
  return event.source === 'predicted' ? `${formatInstant(event.at)} (predicted)` : formatInstant(event.at)
}

/** "What" of an event: its label, note, an early tap's shortfall and every correction with its reason. */
export function eventWhat(event: RecordEvent): string {
  const parts = [(event.source === 'predicted' ? 'PREDICTED: ' : '') + RECORD_EVENT_LABELS[event.type] + (event.note ? ` (${event.note})` : '')]
  if (event.shortfall) parts.push(`Confirmed early: ${event.shortfall}`)
  for (const c of event.corrections ?? []) parts.push(`Corrected from ${formatInstant(c.from)} to ${formatInstant(c.to)} by ${c.by} on ${formatInstant(c.madeAt)}: "${c.reason}"`)
  return parts.join('. ')
}

/** A floor moment nobody tapped, said rather than derived. */
export function notRecordedLine(type: RecordEventType): string {
  return `${RECORD_EVENT_LABELS[type]}: not recorded on the floor; the record does not derive it${type === 'furnace_opened' ? ', so the quench delay is not measured' : ''}.`
}
