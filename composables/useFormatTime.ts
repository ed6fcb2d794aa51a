import { formatDuration } from '~~/shared/duration'

/** Durations and clock times as the shop floor reads them. */
export function useFormatTime() {
  // The server knows neither the reader's time zone nor their language, and its ICU may
  // space times differently from the browser's: until the app is mounted (plugins/localTime.client.ts)
  // every page writes UTC, so the browser's first render matches the server's and hydrates cleanly.
  const local = useState('local-time', () => false)
  const utc = (ms: number, from: number, to: number) => `${new Date(ms).toISOString().slice(from, to).replace('T', ' ')} UTC`

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
    return local.value ? new Date(ms).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' }) : utc(ms, 11, 16)
  }
  /** To the second: what the floor and the records say about when something was recorded. */
  function clockSeconds(ms: number): string {
    return local.value ? new Date(ms).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' }) : utc(ms, 11, 19)
  }
  function dateTime(ms: number): string {
    return local.value ? new Date(ms).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' }) : utc(ms, 0, 16)
  }
  /** To the second, for audit entries and mail times. */
  function dateTimeSeconds(ms: number): string {
    return local.value ? new Date(ms).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'medium' }) : utc(ms, 0, 19)
  }
  function date(ms: number): string {
    return local.value ? new Date(ms).toLocaleDateString(undefined, { dateStyle: 'medium' }) : utc(ms, 0, 10)
  }
  // One duration format everywhere: rounding to whole minutes here could show a
  // deviation's planned and recorded spans as the same "15 min".
  return { countdown, clock, clockSeconds, dateTime, dateTimeSeconds, date, duration: formatDuration }
}
