/**
 * The measured traces over the predicted curve and its band as an inline SVG for the
 * mailed sheet: vector polylines, styles as attributes (mail clients drop <style>).
 * Clients that strip SVG still show the comparison lines beside it and the PDF's chart.
 */
import type { CurvePoint, HoldTimeSheet } from '../../shared/types/records'
import { palette } from '../../shared/palette'

const { ink, temper, bath, alarm } = palette
/** Measured traces in turn take these colours, none of them the predicted curve's or the band's; the PDF uses them too. */
export const TRACE_COLOURS = [alarm[600], ink[900], bath[800], temper[800]]

const WIDTH = 640
const HEIGHT = 240
const PAD = { left: 44, right: 12, top: 12, bottom: 28 }

export function renderTraceSvg(sheet: HoldTimeSheet): string {
  const traces = (sheet.measuredTraces ?? []).map((trace) => trace.points.filter((p) => p.t_s >= 0))
  const band = sheet.predictedBand
  const all = [...sheet.predictedCurve, ...(band ? [...band.slow, ...band.fast] : []), ...traces.flat()]
  const tMax = Math.max(1, ...all.map((p) => p.t_s))
  const temps = [sheet.planned.handling_C, ...all.map((p) => p.T_C)]
  const TMin = Math.min(...temps)
  const TMax = Math.max(...temps) > TMin ? Math.max(...temps) : TMin + 1
  const x = (t: number) => PAD.left + (t / tMax) * (WIDTH - PAD.left - PAD.right)
  const y = (T: number) => PAD.top + (1 - (T - TMin) / (TMax - TMin)) * (HEIGHT - PAD.top - PAD.bottom)
  const line = (points: readonly CurvePoint[], stroke: string, extra = '') =>
    `<polyline fill="none" stroke="${stroke}" ${extra}points="${points.map((p) => `${x(p.t_s).toFixed(1)},${y(p.T_C).toFixed(1)}`).join(' ')}"/>`
  // Labels are numbers and fixed words only, so they need no escaping.
  const text = (tx: number, ty: number, value: string, anchor = 'start') =>
    `<text x="${tx.toFixed(1)}" y="${ty.toFixed(1)}" font-size="10" fill="${ink[600]}" text-anchor="${anchor}">${value}</text>`
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${HEIGHT}" viewBox="0 0 ${WIDTH} ${HEIGHT}" role="img" aria-label="Measured and predicted handling-point temperature" data-chart="measured">`,
    `<rect x="${PAD.left}" y="${PAD.top}" width="${WIDTH - PAD.left - PAD.right}" height="${HEIGHT - PAD.top - PAD.bottom}" fill="none" stroke="${ink[200]}"/>`,
    `<line x1="${PAD.left}" x2="${WIDTH - PAD.right}" y1="${y(sheet.planned.handling_C).toFixed(1)}" y2="${y(sheet.planned.handling_C).toFixed(1)}" stroke="${bath[600]}" stroke-dasharray="4 3"/>`,
    ...(band ? [line(band.slow, temper[600], 'stroke-dasharray="2 2" '), line(band.fast, temper[600], 'stroke-dasharray="2 2" ')] : []),
    line(sheet.predictedCurve, temper[400], 'stroke-width="2" '),
    ...traces.map((points, i) => line(points, TRACE_COLOURS[i % TRACE_COLOURS.length]!, 'stroke-width="1.5" ')),
    text(PAD.left - 4, PAD.top + 8, `${TMax.toFixed(0)} °C`, 'end'),
    text(PAD.left - 4, HEIGHT - PAD.bottom, `${TMin.toFixed(0)} °C`, 'end'),
    text(PAD.left, HEIGHT - 8, '0 s'),
    text(WIDTH - PAD.right, HEIGHT - 8, `${tMax.toFixed(0)} s after the quench`, 'end'),
    '</svg>',
  ].join('')
}
