/**
 * The predicted curve as CSV (RFC 4180: comma separated, CRLF line ends). Units are in
 * the column names and the header is plain ASCII, so spreadsheets open it without an
 * encoding prompt. A record with measured traces adds, on the same rows, the quench
 * band's ends and each trace read at the row's time (straight lines between its kept
 * points; empty where the log does not reach).
 */
import type { CurvePoint, MeasuredTrace, PredictedBand } from '../../shared/types/records'
import { temperatureAt } from './deviations'

export const CURVE_CSV_HEADER = 'time_since_quench_s,time_since_quench_min,handling_point_temperature_C'

export interface MeasuredColumns {
  band?: PredictedBand
  traces?: readonly MeasuredTrace[]
}

/** A column name from a trace: ASCII letters, digits and underscores only. */
export function traceColumn(trace: Pick<MeasuredTrace, 'fileName' | 'channel'>): string {
  const ascii = (text: string) => text.normalize('NFKD').replace(/[^A-Za-z0-9]+/g, '_').replace(/^_+|_+$/g, '')
  return `measured_${ascii(trace.fileName)}_${ascii(trace.channel)}_C`
}

const reader = (points: readonly CurvePoint[]) => {
  const series = { label: '', t_s: points.map((p) => p.t_s), T_C: points.map((p) => p.T_C) }
  return (t: number) => {
    const T = temperatureAt(series, t)
    return T === null ? '' : T.toFixed(1)
  }
}

export function renderCurveCsv(curve: readonly CurvePoint[], measured: MeasuredColumns = {}): string {
  const extra: { name: string; at: (t: number) => string }[] = [
    ...(measured.band ? [{ name: 'band_slow_end_C', at: reader(measured.band.slow) }, { name: 'band_fast_end_C', at: reader(measured.band.fast) }] : []),
    ...(measured.traces ?? []).map((trace) => ({ name: traceColumn(trace), at: reader(trace.points) })),
  ]
  const rows = curve.map((point) => {
    if (!Number.isFinite(point.t_s) || !Number.isFinite(point.T_C)) {
      throw new TypeError(`Curve point (${point.t_s}, ${point.T_C}) is not a number`)
    }
    return [`${point.t_s.toFixed(1)},${(point.t_s / 60).toFixed(2)},${point.T_C.toFixed(1)}`, ...extra.map((column) => column.at(point.t_s))].join(',')
  })
  return [[CURVE_CSV_HEADER, ...extra.map((column) => column.name)].join(','), ...rows].join('\r\n') + '\r\n'
}
