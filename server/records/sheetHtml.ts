/**
 * The hold-time sheet as an e-mail body. Mail clients drop <style> blocks and classes,
 * so every style is inline and the layout is tables; colours are the app's palette.
 */
import type { HoldTimeSheet } from '../../shared/types/records'
import { palette, white } from '../../shared/palette'
import { eventWhat, eventWhen, formatInstant, formatSpan, formatTemperature, notRecordedLine, spanRows } from './format'
import { comparisonLine } from './measuredTraces'
import { renderTraceSvg } from './sheetSvg'

const { ink, temper, bath, alarm } = palette

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)
}

const cell = `padding:6px 10px;border-bottom:1px solid ${ink[200]};text-align:left;vertical-align:top;`
const headCell = `${cell}font-size:11px;text-transform:uppercase;letter-spacing:0.04em;color:${ink[600]};`

function rows(pairs: [string, string][]): string {
  return pairs
    .map(([label, value]) => `<tr><th style="${headCell}width:38%;">${escapeHtml(label)}</th><td style="${cell}">${escapeHtml(value)}</td></tr>`)
    .join('')
}

function section(title: string, body: string): string {
  return `<h2 style="margin:24px 0 8px;font-size:16px;color:${ink[900]};">${escapeHtml(title)}</h2>${body}`
}

const table = (inner: string) => `<table role="presentation" cellspacing="0" cellpadding="0" style="width:100%;border-collapse:collapse;font-size:14px;">${inner}</table>`

export function renderSheetHtml(sheet: HoldTimeSheet): string {
  const { planned } = sheet
  const identity = table(rows([
    ['Part', `${sheet.part.name} (${sheet.part.number}), ${sheet.part.quantity} pcs, ${sheet.part.section}`],
    ['Material', sheet.material],
    ['Furnace', `${sheet.furnace} at ${formatTemperature(planned.furnace_C)}`],
    ['Quench', `${sheet.quenchStation}, ${sheet.quenchant}`],
    ['Plan', `${sheet.plan.name}, revision ${sheet.plan.revision}`],
  ]))

  const times = table(
    `<tr><th style="${headCell}">Span</th><th style="${headCell}">Planned</th><th style="${headCell}">Recorded</th></tr>` +
    spanRows(sheet)
      .map(([a, b, c]) => `<tr><td style="${cell}">${escapeHtml(a!)}</td><td style="${cell}">${escapeHtml(b!)}</td><td style="${cell}">${escapeHtml(c!)}</td></tr>`)
      .join(''),
  )

  const deviations = sheet.deviations.length
    ? `<div style="background:${alarm[50]};border:1px solid ${alarm[400]};border-radius:6px;padding:10px 14px;color:${alarm[800]};font-size:14px;"><ul style="margin:0;padding-left:18px;">${sheet.deviations
      .map((deviation) => `<li data-rule="${deviation.rule}">${escapeHtml(deviation.message)}</li>`)
      .join('')}</ul></div>`
    : `<p style="background:${bath[50]};border-radius:6px;padding:10px 14px;color:${bath[800]};font-size:14px;margin:0;">No deviations from the plan.</p>`

  // Predicted moments: grey italic with a dashed rule, so they never read as floor entries.
  const look = (predicted: boolean) => (predicted ? `${cell}font-style:italic;color:${ink[600]};border-left:3px dashed ${ink[400]};` : `${cell}border-left:3px solid ${ink[900]};`)
  const missing = sheet.notRecorded.map((type) => `<p data-not-recorded="${type}" style="background:${alarm[50]};color:${alarm[800]};border-radius:6px;padding:8px 12px;margin:0 0 8px;font-size:14px;">${escapeHtml(notRecordedLine(type))}</p>`).join('')
  const events =
    missing +
    table(
      `<tr><th style="${headCell}">When</th><th style="${headCell}">What</th><th style="${headCell}">Who</th></tr>` +
      sheet.events
        .map((event) => {
          const style = look(event.source === 'predicted')
          return `<tr data-type="${event.type}" data-source="${event.source}"><td style="${style}white-space:nowrap;">${escapeHtml(eventWhen(event))}</td><td style="${style}">${escapeHtml(eventWhat(event))}</td><td style="${style}">${escapeHtml(event.by)}</td></tr>`
        })
        .join(''),
    )

  const cautions = `<div style="background:${temper[50]};border-left:4px solid ${temper[400]};padding:10px 14px;color:${temper[800]};font-size:13px;line-height:1.5;"><strong>Cautions</strong><ul style="margin:6px 0 0;padding-left:18px;">${sheet.cautions
    .map((caution) => `<li>${escapeHtml(caution)}</li>`)
    .join('')}</ul></div>`

  const last = sheet.predictedCurve.at(-1)
  const curveNote = last
    ? `<p style="font-size:14px;color:${ink[600]};margin:0;">${sheet.predictedCurve.length} predicted points from ${formatTemperature(sheet.predictedCurve[0]!.T_C)} at the quench to ${formatTemperature(last.T_C)} after ${formatSpan(last.t_s)}; the full curve is in the attached PDF and CSV.</p>`
    : ''

  const measured = (sheet.measuredTraces ?? [])
    .map((trace) => `<p data-trace="${escapeHtml(trace.label)}" style="font-size:14px;margin:0 0 6px;">${escapeHtml(comparisonLine(trace, planned.handling_C))}<br><span style="font-size:12px;color:${ink[600]};">Aligned: ${escapeHtml(trace.alignment)}.</span></p>`)
    .join('')
  const measuredNote = `<p style="font-size:12px;color:${ink[600]};margin:0;">${sheet.predictedBand ? 'The traces are drawn over the predicted curve (orange) and its band (dotted) above and in the attached PDF' : 'The traces are drawn over the predicted curve (orange) above and in the attached PDF (the band could not be computed again for this plan revision)'}; the CSV has them beside the predicted curve.</p>`

  const signOff = sheet.signOffUrl
    ? `<p style="margin:24px 0 0;"><a href="${escapeHtml(sheet.signOffUrl)}" data-role="sign-off" style="display:inline-block;background:${bath[800]};color:${white};text-decoration:none;font-weight:600;padding:10px 18px;border-radius:6px;">Review and sign the record</a></p>`
    : ''

  return `<!doctype html><html lang="en"><body style="margin:0;padding:0;background:${ink[50]};">
<div style="max-width:680px;margin:0 auto;padding:24px;font-family:'IBM Plex Sans',Helvetica,Arial,sans-serif;color:${ink[900]};">
<div style="background:${ink[900]};color:${white};border-radius:8px 8px 0 0;padding:14px 20px;border-bottom:3px solid ${temper[400]};">
<div style="font-size:12px;letter-spacing:0.06em;text-transform:uppercase;color:${ink[200]};">${escapeHtml(sheet.shopName)} · Hold-time sheet</div>
<div style="font-size:22px;font-weight:600;margin-top:4px;">Load ${escapeHtml(sheet.loadNumber)}</div>
</div>
<div style="background:${white};border:1px solid ${ink[200]};border-top:0;border-radius:0 0 8px 8px;padding:8px 20px 20px;">
${section('Load', identity)}
${section('Times', times + (sheet.handlingNote ? `<p data-handling-note style="font-size:14px;margin:8px 0 0;">${escapeHtml(sheet.handlingNote)}</p>` : ''))}
${section('Deviations', deviations)}
${section('Predicted cooldown', curveNote)}
${measured ? section('Measured cooling', `<div style="margin:0 0 8px;">${renderTraceSvg(sheet)}</div>` + measured + measuredNote) : ''}
${section('Events', events)}
<div style="margin-top:24px;">${cautions}</div>
${signOff}
</div>
<p style="font-size:12px;color:${ink[600]};margin:12px 4px;">Sent by Slakewise on ${escapeHtml(formatInstant(sheet.generatedAt))}. The PDF and the curve CSV are attached.</p>
</div></body></html>`
}

/** The plain-text part of the same message, for clients that do not show HTML. */
export function renderSheetText(sheet: HoldTimeSheet): string {
  const { planned } = sheet
  const lines = [
    `${sheet.shopName} · Hold-time sheet`,
    `Load ${sheet.loadNumber}`,
    '',
    `Part: ${sheet.part.name} (${sheet.part.number}), ${sheet.part.quantity} pcs, ${sheet.part.section}`,
    `Material: ${sheet.material}`,
    `Furnace: ${sheet.furnace} at ${formatTemperature(planned.furnace_C)}`,
    `Quench: ${sheet.quenchStation}, ${sheet.quenchant}`,
    `Plan: ${sheet.plan.name}, revision ${sheet.plan.revision}`,
    '',
    ...spanRows(sheet).map(([span, plannedValue, recordedValue]) => `${span}: plan ${plannedValue}; recorded ${recordedValue}`),
    ...(sheet.handlingNote ? [sheet.handlingNote] : []),
    '',
    'Deviations:',
    ...(sheet.deviations.length ? sheet.deviations.map((deviation) => `  - ${deviation.message}`) : ['  none']),
    ...(sheet.measuredTraces?.length
      ? ['', 'Measured cooling:', ...sheet.measuredTraces.flatMap((trace) => [`  ${comparisonLine(trace, planned.handling_C)}`, `    Aligned: ${trace.alignment}.`])]
      : []),
    '',
    'Events:',
    ...sheet.notRecorded.map((type) => `  ${notRecordedLine(type)}`),
    ...sheet.events.map((event) => `  ${eventWhen(event)}  ${eventWhat(event)}  (${event.by})`),
    '',
    'Cautions:',
    ...sheet.cautions.map((caution) => `  - ${caution}`),
    ...(sheet.signOffUrl ? ['', `Review and sign the record: ${sheet.signOffUrl}`] : []),
  ]
  return lines.join('\n') + '\n'
}
