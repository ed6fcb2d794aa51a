/**
 * Reading a data logger's export: CSV or TSV text with a header row (comma,
 * semicolon or tab between fields; a decimal comma where the delimiter allows it),
 * one time column (seconds, hh:mm:ss(.s), or date-times) and one or more temperature
 * columns in °C or °F. Parsed by csv-parse as a stream. `previewLog` shows what was
 * detected; `readLog` applies the person's confirmed mapping and returns the series
 * in seconds from the first row and °C. Every refusal is a LogError naming what is
 * wrong, with the row and column where there is one, and the caller stores nothing.
 */
import { parse } from 'csv-parse'
import type { LogColumn, LogMapping, LogPreview, TemperatureUnit, TimeFormat } from '../../shared/types/measurementLog'

export const MAX_LOG_BYTES = 10 * 1024 * 1024
export const MAX_LOG_ROWS = 200_000
const PREVIEW_ROWS = 10

export class LogError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(`${field}: ${message}`)
    this.name = 'LogError'
  }
}

export type { LogColumn, LogMapping, LogPreview, TemperatureUnit, TimeFormat }

export interface LogSeries {
  t_s: number[]
  channels: { name: string; unit: TemperatureUnit; T_C: number[] }[]
}

/** Text from the file's bytes: UTF-8 (with or without a byte-order mark) or UTF-16 with one. */
function decode(bytes: Uint8Array): string {
  if (bytes.length > MAX_LOG_BYTES) throw new LogError('file', `is ${(bytes.length / 1048576).toFixed(1)} MB, over the 10 MB limit`)
  if (bytes.length === 0) throw new LogError('file', 'is empty')
  const utf16 = (bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff)
  if (!utf16 && bytes.includes(0)) throw new LogError('file', 'is not text (it holds NUL bytes); export the log as CSV or TSV')
  let text: string
  try {
    text = new TextDecoder(utf16 ? (bytes[0] === 0xff ? 'utf-16le' : 'utf-16be') : 'utf-8', { fatal: true }).decode(bytes)
  } catch {
    throw new LogError('file', 'is in an unknown text encoding; save it as UTF-8')
  }
  text = text.replace(/^\uFEFF/, '')
  if (text.trim() === '') throw new LogError('file', 'is empty')
  return text
}

function detectDelimiter(headerLine: string): LogPreview['delimiter'] {
  if (headerLine.includes('\t')) return '\t'
  if (headerLine.includes(';')) return ';'
  return ','
}

async function readRows(text: string, delimiter: string): Promise<string[][]> {
  const parser = parse({ delimiter, trim: true, skip_empty_lines: true, relax_quotes: false })
  parser.end(text)
  const rows: string[][] = []
  try {
    for await (const record of parser as AsyncIterable<string[]>) {
      if (rows.length > MAX_LOG_ROWS) throw new LogError('file', `has more than the ${MAX_LOG_ROWS.toLocaleString('en-GB')}-row limit`)
      rows.push(record)
    }
  } catch (error) {
    if (error instanceof LogError) throw error
    throw new LogError('file', `is not readable CSV: ${(error as Error).message}`)
  }
  return rows
}

const UNIT_F = /°\s*F\b|\bdeg\s*F\b|\(\s*F\s*\)|\[\s*F\s*\]|fahrenheit/i
const UNIT_C = /°\s*C\b|\bdeg\s*C\b|\(\s*C\s*\)|\[\s*C\s*\]|celsius/i
const TIME_NAME = /\b(time|elapsed|date|timestamp|seconds|t)\b/i

export function unitOf(header: string): TemperatureUnit | null {
  if (UNIT_F.test(header)) return 'F'
  if (UNIT_C.test(header)) return 'C'
  return null
}

const NUMBER = /^[-+]?(\d+([.,]\d*)?|[.,]\d+)([eE][-+]?\d+)?$/
const CLOCK = /^(\d+):([0-5]\d):([0-5]\d(?:[.,]\d+)?)$/
const ISO_DATE_TIME = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{1,2}):(\d{2}):(\d{2}(?:[.,]\d+)?)Z?$/
const DAY_FIRST_DATE_TIME = /^(\d{1,2})[./](\d{1,2})[./](\d{4})[ T](\d{1,2}):(\d{2}):(\d{2}(?:[.,]\d+)?)$/

/** Spreadsheet programs run cells that begin like this: refuse rather than store them. */
const FORMULA = /^[=+@]|^-[^\d.,]/

const decimal = (s: string) => Number(s.replace(',', '.'))

function timeFormatOf(cell: string): TimeFormat | null {
  if (NUMBER.test(cell)) return 'seconds'
  if (CLOCK.test(cell)) return 'clock'
  if (ISO_DATE_TIME.test(cell) || DAY_FIRST_DATE_TIME.test(cell)) return 'date-time'
  return null
}

/** Seconds of a time cell in the given format (date-times as seconds since 1970, UTC, only differences matter). */
function secondsOf(cell: string, format: TimeFormat): number | null {
  if (format === 'seconds') return NUMBER.test(cell) ? decimal(cell) : null
  if (format === 'clock') {
    const m = CLOCK.exec(cell)
    return m ? Number(m[1]) * 3600 + Number(m[2]) * 60 + decimal(m[3]) : null
  }
  const iso = ISO_DATE_TIME.exec(cell)
  const day = iso ? null : DAY_FIRST_DATE_TIME.exec(cell)
  const parts = iso ? [iso[1], iso[2], iso[3]] : day ? [day[3], day[2], day[1]] : null
  const clock = iso ? iso.slice(4) : day ? day.slice(4) : null
  if (!parts || !clock) return null
  return Date.UTC(Number(parts[0]), Number(parts[1]) - 1, Number(parts[2]), Number(clock[0]), Number(clock[1])) / 1000 + decimal(clock[2])
}

interface Parsed {
  preview: LogPreview
  header: string[]
  body: string[][]
}

async function parseText(bytes: Uint8Array): Promise<Parsed> {
  const text = decode(bytes)
  const delimiter = detectDelimiter(text.split(/\r?\n/, 1)[0])
  const rows = await readRows(text, delimiter)
  const [header, ...body] = rows
  if (body.length === 0) throw new LogError('file', 'has a header row but no data rows')
  const duplicate = header.find((name, i) => header.indexOf(name) !== i)
  if (duplicate !== undefined) throw new LogError('file', `names the column "${duplicate}" twice`)
  const decimalComma = delimiter !== ',' && body.slice(0, PREVIEW_ROWS).some((r) => r.some((c) => /^[-+]?\d+,\d+$/.test(c)))
  const first = body[0]
  const timeIndex = Math.max(0, header.findIndex((name, i) => TIME_NAME.test(name) && timeFormatOf(first[i] ?? '') !== null))
  const timeFormat = timeFormatOf(first[timeIndex] ?? '')
  const columns: LogColumn[] = header.map((name, i) => ({
    name,
    role: i === timeIndex && timeFormat ? 'time' : NUMBER.test(first[i] ?? '') ? 'temperature' : 'other',
    unit: i === timeIndex ? null : unitOf(name),
  }))
  // Date-times carry no zone in loggers' files: secondsOf reads them as UTC, so the ISO text is the wall clock as written.
  const firstSeconds = timeFormat === 'date-time' ? secondsOf(first[timeIndex]!, 'date-time') : null
  const firstDateTime = firstSeconds === null ? null : new Date(firstSeconds * 1000).toISOString().slice(0, 23)
  const firstRows = [header, ...body.slice(0, PREVIEW_ROWS)]
  return { preview: { delimiter, decimalComma, timeFormat, columns, rows: body.length, firstRows, firstDateTime }, header, body }
}

/** What the file holds, for the person to confirm before anything is stored. */
export async function previewLog(bytes: Uint8Array): Promise<LogPreview> {
  const { preview } = await parseText(bytes)
  if (!preview.timeFormat) throw new LogError('file', 'has no time column of seconds, hh:mm:ss or date-times in its first data row')
  return preview
}

const toCelsius = (value: number, unit: TemperatureUnit) => (unit === 'F' ? ((value - 32) * 5) / 9 : value)

/** The series under a confirmed mapping: seconds from the first row, every channel in °C. */
export async function readLog(bytes: Uint8Array, mapping: LogMapping): Promise<{ preview: LogPreview; series: LogSeries }> {
  const { preview, header, body } = await parseText(bytes)
  const timeIndex = header.indexOf(mapping.time)
  if (timeIndex < 0) throw new LogError('mapping.time', `the file has no column named "${mapping.time}"`)
  if (mapping.channels.length === 0) throw new LogError('mapping.channels', 'map at least one temperature column')
  const channelIndex = mapping.channels.map((c, i) => {
    const index = header.indexOf(c.column)
    if (index < 0) throw new LogError(`mapping.channels.${i}.column`, `the file has no column named "${c.column}"`)
    if (index === timeIndex) throw new LogError(`mapping.channels.${i}.column`, `"${c.column}" is the time column`)
    return index
  })
  const format = timeFormatOf(body[0][timeIndex] ?? '')
  if (!format) throw new LogError('mapping.time', `"${mapping.time}" does not hold seconds, hh:mm:ss or date-times`)
  const where = (row: number, column: number) => `row ${row + 2}, column "${header[column]}"`
  const cellAt = (row: number, column: number) => {
    const cell = body[row][column] ?? ''
    if (FORMULA.test(cell)) throw new LogError('file', `${where(row, column)}: "${cell}" looks like a spreadsheet formula`)
    return cell
  }
  const t_s: number[] = []
  const values: number[][] = mapping.channels.map(() => [])
  let start = 0
  for (let r = 0; r < body.length; r++) {
    const seconds = secondsOf(cellAt(r, timeIndex), format)
    if (seconds === null) throw new LogError('file', `${where(r, timeIndex)}: "${body[r][timeIndex]}" is not a time like the first row's`)
    if (r === 0) start = seconds
    const t = seconds - start
    if (r > 0 && !(t > t_s[r - 1])) throw new LogError('file', `${where(r, timeIndex)}: time goes backwards or repeats (${body[r][timeIndex]})`)
    t_s.push(t)
    channelIndex.forEach((c, k) => {
      const cell = cellAt(r, c)
      if (!NUMBER.test(cell) || (cell.includes(',') && !preview.decimalComma)) throw new LogError('file', `${where(r, c)}: "${cell}" is not a number`)
      values[k].push(toCelsius(decimal(cell), mapping.channels[k].unit))
    })
  }
  return { preview, series: { t_s, channels: mapping.channels.map((c, k) => ({ name: c.column, unit: c.unit, T_C: values[k] })) } }
}
