/**
 * A load's logs on its record, as pure functions: each mapped channel of each log
 * attached to the load becomes a measured trace on the quench's clock, judged by the
 * trace rules (deviations.ts) on every logged row and kept thinned for the page and
 * the sheet.
 *
 * Alignment on the recorded quench tap (its corrected time where it was corrected):
 * - the uploader said how far into the log the quench was tapped (`quenchAtLog_s`):
 *   that log time is the tap;
 * - else the uploader gave the instant of the log's first row (`startedAt`; the upload
 *   form fills it in from the file's first date-time, read in the uploader's time zone):
 *   the tap is at (tap − startedAt) seconds of log time;
 * - else the log's first row is the tap (log time 0 = quench), as when a logger is
 *   started as the load goes in.
 */
import type { CurvePoint, MeasuredTrace } from '../../shared/types/records'
import { compareTrace, type TracePlan, type TraceToJudge } from './deviations'
import { formatInstant, formatSpan } from './format'
import { evenRows } from '../../shared/evenRows'

/** A stored log attached to the load, with its full series (seconds from its first row, °C). */
export interface LoadLog {
  id: number
  fileName: string
  sha256: string
  startedAt: Date | null
  quenchAtLog_s: number | null
  t_s: readonly number[]
  channels: { name: string; T_C: readonly number[] }[]
}

/** Rows a trace keeps on the record at most; the rules read them all. */
export const TRACE_POINTS = 300

/** The log time of the quench tap, and the rule that gave it in words. */
export function alignment(log: Pick<LoadLog, 'startedAt' | 'quenchAtLog_s'>, quenchTap_ms: number): { quenchAtLog_s: number; alignment: string } {
  if (log.quenchAtLog_s !== null) {
    return { quenchAtLog_s: log.quenchAtLog_s, alignment: `the quench tap is ${formatSpan(log.quenchAtLog_s)} into the log, as the uploader gave it` }
  }
  if (log.startedAt !== null) {
    const offset = (quenchTap_ms - log.startedAt.getTime()) / 1000
    const where = offset >= 0 ? `${formatSpan(offset)} into the log` : `${formatSpan(-offset)} before the log's first row`
    return { quenchAtLog_s: offset, alignment: `the log started at ${formatInstant(log.startedAt.toISOString())}, so the quench tap is ${where}` }
  }
  return { quenchAtLog_s: 0, alignment: 'the log\'s first row is the quench tap (no start time or offset given)' }
}

/** At most `max` points, evenly (every k-th and the last). */
export function thinPoints(points: readonly CurvePoint[], max = TRACE_POINTS): CurvePoint[] {
  if (points.length <= max) return [...points]
  return evenRows(points.length, max).map((i) => points[i]!)
}

export interface AlignedTrace extends TraceToJudge {
  log: LoadLog
  channel: string
  quenchAtLog_s: number
  alignment: string
}

/** Each channel of each log on the quench's clock: seconds from the tap, every row kept. */
export function alignedTraces(logs: readonly LoadLog[], quenchTap_ms: number): AlignedTrace[] {
  return logs.flatMap((log) => {
    const aligned = alignment(log, quenchTap_ms)
    const t_s = log.t_s.map((t) => t - aligned.quenchAtLog_s)
    return log.channels.map((channel) => ({ log, channel: channel.name, label: `${log.fileName} · ${channel.name}`, t_s, T_C: channel.T_C, ...aligned }))
  })
}

/**
 * The record's view of one trace: its comparison with the plan and its rows thinned
 * for display. Rows more than `span_s` after the quench are left off the view (a
 * logger left running for hours would flatten the chart); the comparison read them.
 */
export function measuredTrace(trace: AlignedTrace, plan: TracePlan, span_s: number): MeasuredTrace {
  const points: CurvePoint[] = []
  trace.t_s.forEach((t, i) => {
    if (t <= span_s) points.push({ t_s: Math.round(t * 1000) / 1000, T_C: Math.round(trace.T_C[i]! * 100) / 100 })
  })
  return {
    logId: trace.log.id,
    fileName: trace.log.fileName,
    sha256: trace.log.sha256,
    channel: trace.channel,
    label: trace.label,
    quenchAtLog_s: trace.quenchAtLog_s,
    alignment: trace.alignment,
    points: thinPoints(points),
    comparison: compareTrace(plan, trace),
  }
}

/** The comparison in one line, the same on the page, the HTML, the PDF and the text mail. */
export function comparisonLine(trace: Pick<MeasuredTrace, 'label' | 'comparison'>, handling_C: number): string {
  const c = trace.comparison
  const T = (value: number) => `${value.toFixed(1)} °C`
  const release = c.atRelease_C === null
    ? 'the log does not cover the release'
    : `${T(c.atRelease_C)} at the release${c.slowEndAtRelease_C === null ? '' : ` (slow end of the band ${T(c.slowEndAtRelease_C)})`}`
  const reached = c.reachedHandling_s === null
    ? `not below ${T(handling_C)} by the end of the log, ${formatSpan(c.logEnd_s)} after the quench`
    : `below ${T(handling_C)} ${formatSpan(c.reachedHandling_s)} after the quench`
  return `${trace.label}: ${release}; ${reached} (predicted ${formatSpan(c.predictedHandling_s)}).`
}
