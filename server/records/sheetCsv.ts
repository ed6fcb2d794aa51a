/**
 * The predicted curve as CSV (RFC 4180: comma separated, CRLF line ends). Units are in
 * the column names and the header is plain ASCII, so spreadsheets open it without an
 * encoding prompt.
 */
import type { CurvePoint } from '../../shared/types/records'

export const CURVE_CSV_HEADER = 'time_since_quench_s,time_since_quench_min,handling_point_temperature_C'

export function renderCurveCsv(curve: readonly CurvePoint[]): string {
  const rows = curve.map((point) => {
    if (!Number.isFinite(point.t_s) || !Number.isFinite(point.T_C)) {
      throw new TypeError(`Curve point (${point.t_s}, ${point.T_C}) is not a number`)
    }
    return `${point.t_s.toFixed(1)},${(point.t_s / 60).toFixed(2)},${point.T_C.toFixed(1)}`
  })
  return [CURVE_CSV_HEADER, ...rows].join('\r\n') + '\r\n'
}
