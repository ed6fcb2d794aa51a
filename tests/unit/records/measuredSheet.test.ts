import { describe, expect, it } from 'vitest'
import { findTraceDeviations, type TracePlan } from '../../../server/records/deviations'
import { alignedTraces, measuredTrace } from '../../../server/records/measuredTraces'
import { sampleHoldTimeSheet } from '../../../server/records/sampleSheet'
import { CURVE_CSV_HEADER, renderCurveCsv, traceColumn } from '../../../server/records/sheetCsv'
import { renderSheetHtml, renderSheetText } from '../../../server/records/sheetHtml'
import { renderSheetPdf } from '../../../server/records/sheetPdf'
import type { CurvePoint, HoldTimeSheet } from '../../../shared/types/records'
import { pdfText } from '../../support/pdfText'

/**
 * The sample sheet's plan predicts T(t) = 60 + 790·e^(−t/380) (handling 120 °C at
 * 979.5 s). The synthetic load cools more slowly, τ = 420 s (closed form again), and
 * the band's ends are τ = 400 s (slow) and 360 s (fast).
 */
const base = sampleHoldTimeSheet({ loadNumber: 'KB-24-0117', shopName: 'Kestrel Bay Heat Treat', now: new Date('2026-03-04T10:00:00Z') })
const newton = (tau_s: number) => (t: number) => 60 + 790 * Math.exp(-t / tau_s)
const curve = (tau_s: number, step_s: number, to_s: number): CurvePoint[] =>
  Array.from({ length: Math.floor(to_s / step_s) + 1 }, (_, i) => ({ t_s: i * step_s, T_C: newton(tau_s)(i * step_s) }))

const quenchTap_ms = Date.parse('2026-03-04T09:35:00Z')
const logged = curve(420, 10, 1500)
const log = {
  id: 3,
  fileName: 'kb-0117 load.csv',
  sha256: 'cd'.repeat(32),
  startedAt: new Date('2026-03-04T09:34:00Z'),
  quenchAtLog_s: null,
  // Six rows in the furnace before the tap, then the quench.
  t_s: [0, 10, 20, 30, 40, 50, ...logged.map((p) => p.t_s + 60)],
  channels: [{ name: 'Core °C', T_C: [850, 850, 850, 850, 850, 850, ...logged.map((p) => p.T_C)] }],
}
const plan: TracePlan = { handling_C: 120, quenchToHandling_s: base.planned.quenchToHandling_s, quenchToRelease_s: 1200, slowEnd_C: newton(400) }
const traces = alignedTraces([log], quenchTap_ms)
const sheet: HoldTimeSheet = {
  ...base,
  predictedBand: { slow: curve(400, 30, 1500), fast: curve(360, 30, 1500) },
  measuredTraces: traces.map((trace) => measuredTrace(trace, plan, 1500)),
  deviations: [...base.deviations, ...findTraceDeviations(plan, traces)],
}

describe('a sheet with a measured trace', () => {
  it('aligns the log on the tap: started 60 s before the quench, so log time 60 s is the tap', () => {
    expect(sheet.measuredTraces![0]).toMatchObject({ quenchAtLog_s: 60, label: 'kb-0117 load.csv · Core °C' })
    expect(sheet.measuredTraces![0]!.points[0]).toEqual({ t_s: -60, T_C: 850 })
  })

  it('finds both trace deviations: 120 °C reached at 420·ln(790/60) = 1082.6 s against 979.5 s, and 105.4 °C at release above 99.3 °C', () => {
    // Limit 979.5 + max(30, 49.0) = 1028.5 s. At 1200 s: 60 + 790·e^(−1200/420) = 105.4 °C; slow end 60 + 790·e^(−3) = 99.3 °C.
    const [above, slow] = sheet.deviations.filter((d) => d.trace)
    expect(above).toMatchObject({ rule: 'above_band_at_release' })
    expect(above!.measured_C).toBeCloseTo(newton(420)(1200), 6)
    expect(above!.limit_C).toBeCloseTo(newton(400)(1200), 9)
    expect(slow).toMatchObject({ rule: 'slow_cooling' })
    expect(slow!.actual_s).toBeCloseTo(420 * Math.log(790 / 60), 0)
  })

  it('CSV: the band and the trace beside the predicted curve on the same rows, in ASCII column names', () => {
    const [header, first, second, ...rest] = renderCurveCsv(sheet.predictedCurve, { band: sheet.predictedBand, traces: sheet.measuredTraces }).trimEnd().split('\r\n')
    expect(traceColumn(sheet.measuredTraces![0]!)).toBe('measured_kb_0117_load_csv_Core_C_C')
    expect(header).toBe(`${CURVE_CSV_HEADER},band_slow_end_C,band_fast_end_C,measured_kb_0117_load_csv_Core_C_C`)
    expect(first).toBe('0.0,0.00,850.0,850.0,850.0,850.0')
    // 30 s: predicted 60 + 790·e^(−30/380) = 790.0; slow 60 + 790·e^(−30/400) = 792.9; fast 60 + 790·e^(−30/360) = 786.8; measured e^(−30/420): 795.5
    expect(second).toBe('30.0,0.50,790.0,792.9,786.8,795.5')
    expect(rest).toHaveLength(sheet.predictedCurve.length - 2)
  })

  it('CSV: empty cells where the log does not reach', () => {
    const short = { ...sheet.measuredTraces![0]!, points: sheet.measuredTraces![0]!.points.filter((p) => p.t_s <= 600) }
    const rows = renderCurveCsv(sheet.predictedCurve, { traces: [short] }).trimEnd().split('\r\n')
    expect(rows.find((row) => row.startsWith('630.0,'))).toMatch(/,$/)
  })

  it('HTML and text: the comparison line and the alignment for each trace', () => {
    const line = 'kb-0117 load.csv · Core °C: 105.4 °C at the release (slow end of the band 99.3 °C); below 120.0 °C 18 min 03 s after the quench (predicted 16 min 20 s).'
    const html = renderSheetHtml(sheet)
    expect(html).toContain('Measured cooling')
    expect(html).toContain(line)
    expect(html).toContain('Aligned: the log started at 2026-03-04 09:34:00 UTC, so the quench tap is 1 min 00 s into the log.')
    expect(renderSheetText(sheet)).toContain(`  ${line}`)
    // The inline chart: the handling line, the band's two ends, the predicted curve and the trace, as vector polylines.
    const svg = /<svg[^>]*data-chart="measured"[^>]*>.*?<\/svg>/s.exec(html)![0]
    expect(svg.match(/<polyline /g)).toHaveLength(4)
    expect(svg).toContain('stroke="#b42828"')
    // The trace's polyline has one point per kept row from the tap on: 151.
    const tracePoints = /<polyline fill="none" stroke="#b42828" stroke-width="1.5" points="([^"]+)"/.exec(svg)![1]!.split(' ')
    expect(tracePoints).toHaveLength(151)
    expect(renderSheetHtml(base)).not.toContain('Measured cooling')
  })

  it('PDF: the trace drawn over the curve and band, its legend and the comparison line', async () => {
    const pdf = await renderSheetPdf(sheet, { compress: false })
    const text = pdfText(pdf).join('\n')
    expect(text).toContain('Predicted and measured handling-point temperature')
    expect(text).toContain('Measured: kb-0117 load.csv · Core °C')
    expect(text).toContain('105.4 °C at the release (slow end of the band 99.3 °C)')
    const plain = await renderSheetPdf(base, { compress: false })
    const lineTos = (buffer: Buffer) => (buffer.toString('latin1').match(/^[\d.-]+ [\d.-]+ l$/gm) ?? []).length
    // Two band ends of 51 points and the trace's 151 rows from the tap on: 50 + 50 + 150 more segments.
    expect(lineTos(pdf) - lineTos(plain)).toBe(250)
  })
})
