/**
 * The hold-time sheet as a PDF (pdfkit, A4), in IBM Plex Sans embedded as subsets
 * (sheetFonts.ts), so every character the sheet is given prints. The predicted curve is
 * drawn with vector lines, not an image, so it stays sharp when printed and the file stays small.
 */
import PDFDocument from 'pdfkit'
import type { CurvePoint, HoldTimeSheet } from '../../shared/types/records'
import { comparisonLine } from './measuredTraces'
import { TRACE_COLOURS } from './sheetSvg'
import { palette } from '../../shared/palette'
import { eventWhat, eventWhen, formatInstant, formatSpan, formatTemperature, notRecordedLine, spanRows } from './format'
import { sheetFaces, textRuns, type SheetWeight } from './sheetFonts'

const { ink, temper, bath, alarm } = palette

const MARGIN = 50

export interface PdfOptions {
  /** Deflate the page streams (default). Off lets a test read the text operators directly. */
  compress?: boolean
}

type Doc = InstanceType<typeof PDFDocument>

interface Place extends PDFKit.Mixins.TextOptions {
  x?: number
  y?: number
}

/**
 * pdfkit sets each run's baseline its own font's ascent below the line's top; the fallback's
 * ascent differs from Plex's, so the runs of a mixed line take the first face's. pdfkit
 * offers no public reading of either value.
 */
interface PdfkitLineMetrics {
  _font: { ascender: number }
  _fontSize: number
}

/** Text in the runs of the faces that hold its characters; `continued` keeps the runs one paragraph. */
function write(doc: Doc, weight: SheetWeight, text: string, { x, y, ...options }: Place = {}) {
  const faces = sheetFaces()[weight]
  const runs = textRuns(text, faces)
  if (runs.length > 1) {
    const metrics = doc.font(faces[0]!.name) as unknown as PdfkitLineMetrics
    options.baseline = -((metrics._font.ascender / 1000) * metrics._fontSize)
  }
  runs.forEach((run, index) => {
    const continued = index < runs.length - 1
    doc.font(run.face)
    // pdfkit reads a missing x as "options in its place", so a position goes only when there is one.
    if (index === 0 && (x !== undefined || y !== undefined)) doc.text(run.text, x, y, { ...options, continued })
    else doc.text(run.text, { ...options, continued })
  })
}

/** Height of the text as one face would set it: runs in another face differ by a few hundredths of a line. */
function heightOf(doc: Doc, weight: SheetWeight, text: string, options: PDFKit.Mixins.TextOptions): number {
  return doc.font(sheetFaces()[weight][0]!.name).heightOfString(text, options)
}

function heading(doc: Doc, text: string) {
  ensureRoom(doc, 60)
  doc.moveDown(0.8).fontSize(12).fillColor(ink[900])
  write(doc, 'bold', text, { x: MARGIN })
  doc.moveDown(0.3)
}

function ensureRoom(doc: Doc, height: number) {
  if (doc.y + height > doc.page.height - MARGIN) doc.addPage()
}

/** A simple ruled table: column widths in points, first row bold. */
function drawTable(doc: Doc, widths: number[], rows: string[][]) {
  const width = widths.reduce((a, b) => a + b, 0)
  rows.forEach((row, index) => {
    const weight: SheetWeight = index === 0 ? 'bold' : 'regular'
    doc.fontSize(9)
    const height = Math.max(...row.map((text, column) => heightOf(doc, weight, text, { width: widths[column]! - 8 }))) + 8
    ensureRoom(doc, height)
    const top = doc.y
    let x = MARGIN
    row.forEach((text, column) => {
      doc.fillColor(index === 0 ? ink[600] : ink[900])
      write(doc, weight, text, { x: x + 4, y: top + 4, width: widths[column]! - 8 })
      x += widths[column]!
    })
    doc.moveTo(MARGIN, top + height).lineTo(MARGIN + width, top + height).lineWidth(0.5).strokeColor(ink[200]).stroke()
    doc.x = MARGIN
    doc.y = top + height
  })
}

/** Round axis steps (1, 2 or 5 × 10^n) giving about `count` intervals. */
function niceStep(span: number, count: number): number {
  const raw = span / count
  const power = 10 ** Math.floor(Math.log10(raw))
  const fraction = raw / power
  return (fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10) * power
}

function polyline(doc: Doc, points: readonly CurvePoint[], x: (t: number) => number, y: (T: number) => number) {
  if (points.length < 2) return
  doc.moveTo(x(points[0]!.t_s), y(points[0]!.T_C))
  for (const point of points.slice(1)) doc.lineTo(x(point.t_s), y(point.T_C))
  doc.stroke()
}

function drawCurve(doc: Doc, sheet: HoldTimeSheet) {
  const curve = sheet.predictedCurve
  const { handling_C, quenchToHandling_s } = sheet.planned
  const band = sheet.predictedBand
  const traces = sheet.measuredTraces ?? []
  const height = 200
  ensureRoom(doc, height + 40 + 12 * traces.length)
  const left = MARGIN + 40
  const top = doc.y + 6
  const width = doc.page.width - MARGIN - left
  // Rows logged before the quench are left off the chart, whose clock starts at the tap.
  const shown = traces.map((trace) => trace.points.filter((p) => p.t_s >= 0))
  const all = [...curve, ...(band ? [...band.slow, ...band.fast] : []), ...shown.flat()]
  const tMax = Math.max(quenchToHandling_s, ...all.map((p) => p.t_s))
  const temps = [handling_C, ...all.map((p) => p.T_C)]
  const stepT = niceStep(Math.max(...temps) - Math.min(...temps) || 1, 5)
  const TMin = Math.floor(Math.min(...temps) / stepT) * stepT
  const TMax = Math.ceil(Math.max(...temps) / stepT) * stepT
  const minutes = tMax / 60
  const stepMin = niceStep(minutes || 1, 6)
  const x = (t_s: number) => left + (t_s / 60 / (Math.ceil(minutes / stepMin) * stepMin)) * width
  const y = (T_C: number) => top + height - ((T_C - TMin) / (TMax - TMin)) * height

  doc.lineWidth(0.5).strokeColor(ink[200]).fontSize(8).fillColor(ink[600])
  for (let T = TMin; T <= TMax + 1e-9; T += stepT) {
    doc.moveTo(left, y(T)).lineTo(left + width, y(T)).stroke()
    write(doc, 'regular', `${T.toFixed(0)}`, { x: MARGIN, y: y(T) - 4, width: 34, align: 'right' })
  }
  for (let m = 0; m <= Math.ceil(minutes / stepMin) * stepMin + 1e-9; m += stepMin) {
    doc.moveTo(x(m * 60), top).lineTo(x(m * 60), top + height).stroke()
    write(doc, 'regular', `${Number(m.toPrecision(6))}`, { x: x(m * 60) - 15, y: top + height + 4, width: 30, align: 'center' })
  }
  write(doc, 'regular', '°C', { x: MARGIN, y: top - 16, width: 34, align: 'right' })
  write(doc, 'regular', 'minutes after the quench starts', { x: left, y: top + height + 16, width, align: 'center' })

  // The handling temperature and the predicted handling time, dashed, so the reader sees where the curve crosses.
  doc.lineWidth(1).strokeColor(bath[600]).dash(4, { space: 3 })
  doc.moveTo(left, y(handling_C)).lineTo(left + width, y(handling_C)).stroke()
  doc.moveTo(x(quenchToHandling_s), top).lineTo(x(quenchToHandling_s), top + height).stroke()
  doc.undash()
  doc.fillColor(bath[600])
  write(doc, 'regular', `handling ${formatTemperature(handling_C)} at ${formatSpan(quenchToHandling_s)}`, { x: x(quenchToHandling_s) + 4, y: y(handling_C) - 12 })

  if (band) {
    // The band's ends as thin dotted lines: the slow end is what the release is judged against.
    doc.lineWidth(0.8).strokeColor(temper[600]).dash(1.5, { space: 2 })
    polyline(doc, band.slow, x, y)
    polyline(doc, band.fast, x, y)
    doc.undash()
  }
  doc.lineWidth(1.6).strokeColor(temper[400]).lineJoin('round')
  polyline(doc, curve, x, y)
  shown.forEach((points, i) => {
    doc.lineWidth(1.2).strokeColor(TRACE_COLOURS[i % TRACE_COLOURS.length]!)
    polyline(doc, points, x, y)
  })
  doc.x = MARGIN
  doc.y = top + height + 32
  if (traces.length) {
    doc.fontSize(8)
    doc.fillColor(temper[600])
    write(doc, 'regular', `Orange: predicted handling point${band ? '; dotted: the quench band\'s slow and fast ends' : ''}.`, { x: MARGIN })
    traces.forEach((trace, i) => {
      doc.fillColor(TRACE_COLOURS[i % TRACE_COLOURS.length]!)
      write(doc, 'regular', `Measured: ${trace.label}`, { x: MARGIN })
    })
  }
}

export function renderSheetPdf(sheet: HoldTimeSheet, options: PdfOptions = {}): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: MARGIN,
    compress: options.compress ?? true,
    info: { Title: `Hold-time sheet, load ${sheet.loadNumber}`, Author: sheet.shopName, Creator: 'Slakewise' },
  })
  const chunks: Buffer[] = []
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })
  for (const face of [...sheetFaces().regular, ...sheetFaces().bold]) doc.registerFont(face.name, face.data)
  const contentWidth = doc.page.width - 2 * MARGIN
  const { planned } = sheet

  doc.rect(0, 0, doc.page.width, 6).fill(temper[400])
  doc.fontSize(9).fillColor(ink[600])
  write(doc, 'regular', `${sheet.shopName} · Hold-time sheet`, { x: MARGIN, y: MARGIN })
  doc.fontSize(20).fillColor(ink[900])
  write(doc, 'bold', `Load ${sheet.loadNumber}`)
  doc.fontSize(9).fillColor(ink[600])
  write(doc, 'regular', `Generated ${formatInstant(sheet.generatedAt)}`)

  heading(doc, 'Load')
  drawTable(doc, [150, contentWidth - 150], [
    ['Item', 'Value'],
    ['Part', `${sheet.part.name} (${sheet.part.number}), ${sheet.part.quantity} pcs, ${sheet.part.section}`],
    ['Material', sheet.material],
    ['Furnace', `${sheet.furnace} at ${formatTemperature(planned.furnace_C)}`],
    ['Quench', `${sheet.quenchStation}, ${sheet.quenchant}`],
    ['Plan', `${sheet.plan.name}, revision ${sheet.plan.revision}`],
  ])

  heading(doc, 'Times')
  drawTable(doc, [contentWidth - 260, 130, 130], [['Span', 'Planned', 'Recorded'], ...spanRows(sheet)])
  if (sheet.handlingNote) {
    doc.fontSize(9).fillColor(ink[600])
    write(doc, 'regular', sheet.handlingNote, { width: contentWidth })
  }

  heading(doc, 'Deviations')
  if (sheet.deviations.length === 0) {
    doc.fontSize(10).fillColor(bath[600])
    write(doc, 'regular', 'No deviations from the plan.')
  } else {
    doc.fontSize(10).fillColor(alarm[600])
    for (const deviation of sheet.deviations) write(doc, 'regular', `•  ${deviation.message}`, { width: contentWidth })
  }

  heading(doc, sheet.measuredTraces?.length ? 'Predicted and measured handling-point temperature' : 'Predicted handling-point temperature')
  drawCurve(doc, sheet)
  if (sheet.measuredTraces?.length) {
    heading(doc, 'Measured cooling')
    for (const trace of sheet.measuredTraces) {
      doc.fontSize(10).fillColor(ink[900])
      write(doc, 'regular', comparisonLine(trace, planned.handling_C), { x: MARGIN, width: contentWidth })
      doc.fontSize(8).fillColor(ink[600])
      write(doc, 'regular', `Aligned: ${trace.alignment}.`, { x: MARGIN, width: contentWidth })
      doc.moveDown(0.3)
    }
  }

  heading(doc, 'Events')
  doc.fontSize(10).fillColor(alarm[600])
  for (const type of sheet.notRecorded) write(doc, 'regular', notRecordedLine(type), { x: MARGIN, width: contentWidth })
  drawTable(doc, [130, contentWidth - 260, 130], [['When', 'What', 'Who'], ...sheet.events.map((event) => [eventWhen(event), eventWhat(event), event.by])])

  heading(doc, 'Cautions')
  doc.fontSize(9).fillColor(temper[800])
  for (const caution of sheet.cautions) {
    ensureRoom(doc, 30)
    write(doc, 'regular', `•  ${caution}`, { x: MARGIN, width: contentWidth })
    doc.moveDown(0.3)
  }

  doc.end()
  return done
}
