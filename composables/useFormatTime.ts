import { formatDuration } from '~~/shared/duration'

/** Durations and clock times as the shop floor reads them. */
export function useFormatTime() {
  /** 1:02:03 or 2:03; a leading minus for a time already passed. */
  function countdown(seconds: number): string {
    const sign = seconds < 0 ? '−' : ''
    const total = Math.floor(Math.abs(seconds))
    const h = Math.floor(total / 3600)
    const m = Math.floor((total % 3600) / 60)
    const s = total % 60
    const mm = h > 0 ? String(m).padStart(2, '0') : String(m)
    return `${sign}${h > 0 ? `${h}:` : ''}${mm}:${String(s).padStart(2, '0')}`
  }
  function clock(ms: number): string {
    return new Date(ms).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' })
  }
  /** To the second: what the floor and the records say about when something was recorded. */
  function clockSeconds(ms: number): string {
    return new Date(ms).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' })
  }
  function dateTime(ms: number): string {
    return new Date(ms).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })
  }
  function dateTimeSeconds(ms: number): string {
    return new Date(ms).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'medium' })
  }
  // One duration format everywhere: rounding to whole minutes here could show a
  // deviation's planned and recorded spans as the same "15 min".
  return { countdown, clock, clockSeconds, dateTime, dateTimeSeconds, duration: formatDuration }
}
