// The record mails other than the hold-time sheet (sheetMail.ts): a rejection and the
// daily digest of records waiting for sign-off. Plain HTML with inline styles, as mail
// clients ignore style sheets.
import { palette } from '../../shared/palette'
import type { RecordSnapshot } from '../../shared/types/cooldownRecord'
import type { OutgoingMail } from '../outbox/enqueue'
import { formatInstant } from './format'
import { escapeHtml } from './sheetHtml'

/** The mail that tells the metallurgists a record was rejected, with the QA lead's comment. */
export function rejectionMail(id: number, snapshot: RecordSnapshot, comment: string, by: string, at: Date, to: string[], url: string): OutgoingMail {
  const load = snapshot.batch.loadNumber
  return {
    dedupeKey: `rejection:record-${id}`,
    to,
    subject: `Cooldown record rejected · Load ${load} · ${snapshot.plan.name}`,
    html: `<!doctype html><html lang="en"><body style="font-family:'IBM Plex Sans',Helvetica,Arial,sans-serif;color:${palette.ink[900]};">
<h1 style="font-size:20px;">Load ${escapeHtml(load)}: cooldown record rejected</h1>
<p>${escapeHtml(by)} rejected the record on ${escapeHtml(formatInstant(at.toISOString()))}.</p>
<blockquote style="border-left:4px solid ${palette.alarm[600]};margin:12px 0;padding:6px 12px;background:${palette.alarm[50]};" data-role="comment">${escapeHtml(comment)}</blockquote>
<p>Plan: ${escapeHtml(snapshot.plan.name)}, revision ${snapshot.plan.revision}. Deviations recorded: ${snapshot.deviations.length ? snapshot.deviations.map((d) => escapeHtml(d.message)).join('; ') : 'none'}.</p>
<p><a href="${escapeHtml(url)}">Open the record</a></p>
</body></html>`,
    text: `Load ${load}: cooldown record rejected by ${by} on ${formatInstant(at.toISOString())}.\n\nComment: ${comment}\n\nPlan: ${snapshot.plan.name}, revision ${snapshot.plan.revision}\nRecord: ${url}\n`,
  }
}

/** One record in the digest. */
export interface DigestLine {
  id: number
  loadNumber: string
  releasedAt: string
  plan: string
  furnace: string
  deviations: number
}

/** The digest of records unsigned for more than a day, each linked by `urlOf`. */
export function digestMail(dedupeKey: string, to: string[], records: DigestLine[], urlOf: (id: number) => string): OutgoingMail {
  const day = dedupeKey.slice('digest:'.length)
  const line = (r: DigestLine) => `${r.loadNumber} · ${r.plan} · ${r.furnace} · released ${formatInstant(r.releasedAt)} · ${r.deviations} deviation${r.deviations === 1 ? '' : 's'}`
  return {
    dedupeKey,
    to,
    subject: `Records waiting for sign-off · ${day} · ${records.length}`,
    html: `<!doctype html><html lang="en"><body style="font-family:'IBM Plex Sans',Helvetica,Arial,sans-serif;color:${palette.ink[900]};">
<h1 style="font-size:20px;">${records.length} cooldown record${records.length === 1 ? '' : 's'} unsigned for more than a day</h1>
<ul>${records.map((r) => `<li data-load="${escapeHtml(r.loadNumber)}"><a href="${escapeHtml(urlOf(r.id))}">${escapeHtml(line(r))}</a></li>`).join('')}</ul>
</body></html>`,
    text: `Cooldown records unsigned for more than a day (${day}):\n${records.map((r) => `  - ${line(r)}  ${urlOf(r.id)}`).join('\n')}\n`,
  }
}
