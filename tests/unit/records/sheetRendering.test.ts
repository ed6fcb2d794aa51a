import { describe, expect, it } from 'vitest'
import { STANDARD_CAUTIONS } from '../../../server/records/cautions'
import { sampleHoldTimeSheet } from '../../../server/records/sampleSheet'
import { CURVE_CSV_HEADER, renderCurveCsv } from '../../../server/records/sheetCsv'
import { escapeHtml, renderSheetHtml, renderSheetText } from '../../../server/records/sheetHtml'
import { renderSheetPdf } from '../../../server/records/sheetPdf'
import { MISSING_GLYPH, pdfEmbeddedFonts, pdfText } from '../../support/pdfText'

const sheet = sampleHoldTimeSheet({ loadNumber: 'KB-24-0117', shopName: 'Kestrel Bay Heat Treat', now: new Date('2026-03-04T10:00:00Z') })

describe('renderCurveCsv', () => {
  it('writes units in the header and one CRLF-terminated row per point', () => {
    const csv = renderCurveCsv([
      { t_s: 0, T_C: 850 },
      { t_s: 90, T_C: 683.44 },
      { t_s: 1234.56, T_C: 99.96 },
    ])
    expect(csv).toBe(
      'time_since_quench_s,time_since_quench_min,handling_point_temperature_C\r\n' +
      '0.0,0.00,850.0\r\n' +
      '90.0,1.50,683.4\r\n' +
      '1234.6,20.58,100.0\r\n',
    )
  })

  it('is only the header for an empty curve, and refuses a point that is not a number', () => {
    expect(renderCurveCsv([])).toBe(`${CURVE_CSV_HEADER}\r\n`)
    expect(() => renderCurveCsv([{ t_s: 30, T_C: Number.NaN }])).toThrow('Curve point (30, NaN) is not a number')
  })

  it('the sample curve: 850 °C at the quench, 60 + 790·e^(−30/380) = 790.0 °C after 30 s', () => {
    const [header, first, second] = renderCurveCsv(sheet.predictedCurve).split('\r\n')
    expect(header).toBe(CURVE_CSV_HEADER)
    expect(first).toBe('0.0,0.00,850.0')
    expect(second).toBe('30.0,0.50,790.0')
  })
})

describe('sample sheet', () => {
  it('predicts handling at ln(790/60)·380 s = 979.5 s and records a 52 s transfer against 30 s', () => {
    expect(sheet.planned.quenchToHandling_s).toBeCloseTo(979.52, 2)
    // charged → core at heat 72 min, soak 65 min, door → quench 52 s, quench → release 20 min
    expect(sheet.measured).toEqual({ heatUp_s: 4320, soak_s: 3900, quenchDelay_s: 52, quenchToRelease_s: 1200 })
    expect(sheet.deviations.map((deviation) => deviation.rule)).toEqual(['quench_delay'])
    expect(sheet.shopName).toBe('Kestrel Bay Heat Treat')
  })
})

describe('renderSheetHtml', () => {
  const html = renderSheetHtml(sheet)

  it('names the load, lists every caution and the deviation, all styles inline', () => {
    expect(html).toContain('Load KB-24-0117')
    for (const caution of STANDARD_CAUTIONS) expect(html).toContain(escapeHtml(caution))
    expect(html).toContain('Quench delay 52 s from the furnace door opening to the quench, 22 s over the allowed 30 s.')
    expect(html).not.toMatch(/<style|class=/)
  })

  it('shows who recorded each event and when, in UTC', () => {
    expect(html).toContain('2026-03-04 09:55:00 UTC</td><td style="padding:6px 10px;border-bottom:1px solid #cbd3dc;text-align:left;vertical-align:top;border-left:3px solid #131b24;">Released</td>')
    expect(html).toContain('June Halvorsen')
  })

  it('shows a predicted moment in grey italics behind a dashed rule, labelled predicted', () => {
    const row = html.match(/<tr data-type="ready_to_handle" data-source="predicted">.*?<\/tr>/)?.[0] ?? ''
    expect(row).toContain('2026-03-04 09:51:20 UTC (predicted)')
    expect(row).toContain('PREDICTED: Ready to handle')
    expect(row).toContain('font-style:italic;')
    expect(row).toContain('border-left:3px dashed')
  })

  it('says a missing door tap is not recorded, lists an early tap and a correction with its reason', () => {
    const events = sheet.events.map((event) =>
      event.type === 'soaking'
        ? { ...event, shortfall: 'Core at heat 14 s after charging, 2 min 25 s before the predicted heat-up of 2 min 39 s.', originalAt: '2026-03-04T08:29:00.000Z', corrections: [{ from: '2026-03-04T08:29:00.000Z', to: event.at, reason: 'Tapped on the wrong card', by: 'Ines Brandt', madeAt: '2026-03-04T09:00:00.000Z' }] }
        : event,
    ).filter((event) => event.type !== 'furnace_opened')
    const out = renderSheetHtml({ ...sheet, events, notRecorded: ['furnace_opened'], measured: { ...sheet.measured, quenchDelay_s: null } })
    expect(out).toContain('Out of the furnace (door open): not recorded on the floor; the record does not derive it, so the quench delay is not measured.')
    expect(out).toContain('not measured: door opening not recorded')
    expect(out).toContain('Confirmed early: Core at heat 14 s after charging, 2 min 25 s before the predicted heat-up of 2 min 39 s.')
    expect(out).toContain('Corrected from 2026-03-04 08:29:00 UTC to 2026-03-04 08:29:08 UTC by Ines Brandt on 2026-03-04 09:00:00 UTC: &quot;Tapped on the wrong card&quot;')
  })

  it('escapes text that came from people', () => {
    const hostile = { ...sheet, loadNumber: '<b>KB-1</b>', events: [{ ...sheet.events[0]!, by: 'A & "B"' }] }
    const out = renderSheetHtml(hostile)
    expect(out).toContain('Load &lt;b&gt;KB-1&lt;/b&gt;')
    expect(out).toContain('A &amp; &quot;B&quot;')
    expect(out).not.toContain('<b>KB-1</b>')
  })

  it('says so when there are no deviations', () => {
    expect(renderSheetHtml({ ...sheet, deviations: [] })).toContain('No deviations from the plan.')
  })

  it('has a plain-text twin with the same load number and cautions', () => {
    const text = renderSheetText(sheet)
    expect(text).toContain('Load KB-24-0117')
    expect(text).toContain('Quench delay (furnace door to quench): plan at most 30 s; recorded 52 s')
    expect(text).toContain('2026-03-04 09:51:20 UTC (predicted)  PREDICTED: Ready to handle')
    for (const caution of STANDARD_CAUTIONS) expect(text).toContain(caution)
  })
})

describe('renderSheetPdf', () => {
  it('is a PDF whose page text carries the load number, the deviation and the cautions', async () => {
    const pdf = await renderSheetPdf(sheet, { compress: false })
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(pdf.subarray(-6).toString('latin1')).toMatch(/%%EOF\s*$/)
    const text = pdfText(pdf)
    expect(text).toContain('Load KB-24-0117')
    expect(text).toContain('•  Quench delay 52 s from the furnace door opening to the quench, 22 s over the allowed 30 s.')
    expect(text.join(' ')).toContain('Parts stay hot long after they look cool')
    expect(text).toContain('handling 120 °C at 16 min 20 s')
  })

  it('embeds IBM Plex Sans and prints every character it is given, ≤ and ≥ included', async () => {
    // A material name as a metallurgist might type it: the PDF standard fonts (WinAnsi) have no ≤, ≥ or Ł.
    const material = 'Mn ≤ 1 %, core ≥ 850 °C ± 5 — grain 12 µm · Łódź'
    const pdf = await renderSheetPdf({ ...sheet, material }, { compress: false })
    const text = pdfText(pdf)
    expect(text).toContain(material)
    expect(text.join('\n')).not.toContain(MISSING_GLYPH)
    // Plex for what its subsets hold (regular, and semibold for headings); DejaVu Sans only for ≤ and ≥.
    expect(pdfEmbeddedFonts(pdf)).toEqual(['DejaVuSans', 'IBMPlexSans-Regular', 'IBMPlexSans-SemiBold'])
    expect(pdf.toString('latin1')).not.toContain('/BaseFont /Helvetica')
  })

  it('draws the curve as vector lines: one segment per point after the first', async () => {
    const pdf = (await renderSheetPdf(sheet, { compress: false })).toString('latin1')
    // pdfkit writes "x y l" for lineTo; the curve has 42 points, the grid and markers add a few more.
    const lineTos = pdf.match(/^[\d.-]+ [\d.-]+ l$/gm) ?? []
    expect(sheet.predictedCurve).toHaveLength(42)
    expect(lineTos.length).toBeGreaterThanOrEqual(41)
  })

  it('compresses by default and still starts as a PDF', async () => {
    const compressed = await renderSheetPdf(sheet)
    const plain = await renderSheetPdf(sheet, { compress: false })
    expect(compressed.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(compressed.length).toBeLessThan(plain.length / 2)
    expect(pdfText(compressed)).toEqual([])
  })
})

describe('the handling basis on the sheet', () => {
  const note = 'Predicted handling time: safe-to-handle at the slow end of the quench band; headline estimate 16 min 20 s.'
  const withNote = { ...sheet, handlingNote: note }

  it('is written under the times in HTML, text and PDF, and left out when a record has none', async () => {
    expect(renderSheetHtml(withNote)).toContain(note)
    expect(renderSheetText(withNote)).toContain(note)
    expect(pdfText(await renderSheetPdf(withNote, { compress: false })).join(' ')).toContain('safe-to-handle at the slow end of the quench band')
    expect(renderSheetHtml(sheet)).not.toContain('data-handling-note')
  })
})
