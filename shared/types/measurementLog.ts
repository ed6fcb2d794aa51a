/**
 * Thermocouple logs as the API and the pages see them. The parser
 * (server/measurements/parseLog.ts) produces the preview and reads a file under a
 * mapping; the store (server/measurements/logStore.ts) keeps the file and its series.
 */
export type TemperatureUnit = 'C' | 'F'
export type TimeFormat = 'seconds' | 'clock' | 'date-time'

export interface LogColumn {
  name: string
  role: 'time' | 'temperature' | 'other'
  /** Detected from the header; null when the header does not say. */
  unit: TemperatureUnit | null
}

export interface LogPreview {
  delimiter: ',' | ';' | '\t'
  decimalComma: boolean
  timeFormat: TimeFormat | null
  columns: LogColumn[]
  rows: number
  firstRows: string[][]
  /**
   * The first row's date-time as the file wrote it, without a zone ("2026-03-04T06:15:00.000"),
   * for the upload form to read in the uploader's time zone; null unless the time column holds date-times.
   */
  firstDateTime: string | null
}

/** The person's confirmed reading of a file: which column is time, which are channels and in what unit. */
export interface LogMapping {
  time: string
  channels: { column: string; unit: TemperatureUnit }[]
}

/** A stored log in lists. */
export interface LogSummary {
  id: number
  fileName: string
  size_bytes: number
  sha256: string
  rows: number
  duration_s: number
  channels: string[]
  batchId: number | null
  /** Alignment on the load's quench tap, as the uploader gave it: the first row's instant, or the quench's log time. */
  startedAt: string | null
  quenchAtLog_s: number | null
  loadNumber: string | null
  uploadedBy: string
  uploadedAt: string
}

export interface LogChannelSeries {
  name: string
  /** The unit the file used; values here are always °C. */
  unit: TemperatureUnit
  min_C: number
  max_C: number
  T_C: number[]
}

/** One stored log with its series (thinned to at most `shownPoints` rows for display). */
export interface LogDetail extends LogSummary {
  mapping: LogMapping
  detected: Omit<LogPreview, 'firstRows'>
  shownPoints: number
  t_s: number[]
  series: LogChannelSeries[]
}
