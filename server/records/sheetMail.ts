import type { HoldTimeSheet } from '../../shared/types/records'
import type { OutgoingMail } from '../outbox/enqueue'
import { renderCurveCsv } from './sheetCsv'
import { renderSheetHtml, renderSheetText } from './sheetHtml'
import { renderSheetPdf } from './sheetPdf'

/** File names carry the load number so a saved attachment still says which load it is. */
export function sheetFileNames(loadNumber: string) {
  const safe = loadNumber.replace(/[^A-Za-z0-9._-]/g, '_')
  return { pdf: `hold-time-sheet-${safe}.pdf`, csv: `cooldown-curve-${safe}.csv` }
}

export function sheetSubject(sheet: HoldTimeSheet): string {
  const deviations = sheet.deviations.length
  const flag = deviations ? ` · ${deviations} deviation${deviations === 1 ? '' : 's'}` : ''
  return `Hold-time sheet · Load ${sheet.loadNumber} · ${sheet.part.name}${flag}`
}

/** The complete message for one sheet: HTML and text bodies, the PDF and the curve CSV. */
export async function holdTimeSheetMail(sheet: HoldTimeSheet, to: string[], dedupeKey: string): Promise<OutgoingMail> {
  const names = sheetFileNames(sheet.loadNumber)
  return {
    dedupeKey,
    to,
    subject: sheetSubject(sheet),
    html: renderSheetHtml(sheet),
    text: renderSheetText(sheet),
    attachments: [
      { filename: names.pdf, contentType: 'application/pdf', content: await renderSheetPdf(sheet) },
      { filename: names.csv, contentType: 'text/csv; charset=utf-8', content: renderCurveCsv(sheet.predictedCurve, { band: sheet.predictedBand, traces: sheet.measuredTraces }) },
    ],
  }
}
