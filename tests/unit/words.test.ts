import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { FURNACE_KIND_LABELS, STATION_KIND_LABELS, TERMS } from '../../shared/labels'
import { ROLE_LABELS } from '../../shared/roles'
import { BATCH_STATE_LABELS, TRANSITIONS, checkMove } from '../../shared/schedule'
import { MAIL_RECIPIENT_KIND_INFO } from '../../shared/schemas/mailRecipients'
import { NAV_ITEMS } from '../../shared/navigation'
import { digestMail } from '../../server/records/recordMails'
import { sampleHoldTimeSheet } from '../../server/records/sampleSheet'
import { renderSheetHtml, renderSheetText } from '../../server/records/sheetHtml'
import { renderSheetPdf } from '../../server/records/sheetPdf'
import { sheetSubject } from '../../server/records/sheetMail'
import { retiredWords, retiredWordsIn } from '../support/glossary'
import { pdfText } from '../support/pdfText'

const sheet = sampleHoldTimeSheet({ loadNumber: 'KB-2026-00117', shopName: 'Kestrel Bay Heat Treat', now: new Date('2026-03-04T10:00:00Z') })

describe('the glossary in DEVELOPERS.md', () => {
  it('lists the retired words the tests look for', () => {
    expect(retiredWords()).toEqual([
      'batch', 'Hand on', 'Handed on', 'Withdraw', 'In the bath', 'bath stage', 'Quench-late allowance', 'Measured at', 'ready-to-quench',
      'car-bottom', 'forced-air', 'still-air', 'salt-bath',
    ])
  })

  it('finds a retired word at the start of a word, in any case, and nothing in the words that replaced them', () => {
    expect(retiredWordsIn('Hand on the BATCHES; confirm withdrawal')).toEqual(['batch', 'Hand on', 'Withdraw'])
    expect(retiredWordsIn('Release, Cancel booking, Quenching, Car bottom furnace, Salt bath furnace')).toEqual([])
  })
})

describe('one name per moment in the labels', () => {
  it('states, floor moves, equipment kinds, roles and named spans use none of the retired words', () => {
    const labels = [
      ...Object.values(BATCH_STATE_LABELS),
      ...Object.values(TRANSITIONS).map((t) => t.action),
      ...Object.values(FURNACE_KIND_LABELS),
      ...Object.values(STATION_KIND_LABELS),
      ...Object.values(ROLE_LABELS),
      ...Object.values(TERMS),
      ...NAV_ITEMS.map((item) => `${item.label} ${item.hint}`),
    ]
    expect(retiredWordsIn(labels.join('\n'))).toEqual([])
    expect(BATCH_STATE_LABELS.released).toBe('Released')
    expect(TRANSITIONS.released.action).toBe('Release')
    expect(TRANSITIONS.cancelled.action).toBe('Cancel booking')
    expect(BATCH_STATE_LABELS.quenched).toBe('Quenching')
  })

  it('a refused move names the role by its label, never its key', () => {
    expect(checkMove('ready', 'released', 'qa')).toEqual({ ok: false, status: 403, message: 'The QA lead role cannot record Released' })
  })

  it('the daily digest is described as what it lists: records waiting more than a day', () => {
    expect(MAIL_RECIPIENT_KIND_INFO.daily_digest.description).toBe('One message a day listing the cooldown records that have waited more than a day for QA sign-off.')
  })
})

describe('sheets, mails and the README', () => {
  it('the hold-time sheet (HTML, text, PDF, subject) uses none of the retired words', async () => {
    const pdf = pdfText(await renderSheetPdf(sheet, { compress: false })).join('\n')
    for (const text of [renderSheetHtml(sheet), renderSheetText(sheet), pdf, sheetSubject(sheet)]) expect(retiredWordsIn(text)).toEqual([])
  })

  it('the sheet names the recorded span for what it is: quench to release, beside the predicted handling time', () => {
    // Sample: handling at ln(790/60)·380 s = 979.5 s → "16 min 20 s"; released 20 min after the quench.
    expect(renderSheetText(sheet)).toContain('Quench to release (handling below 120 °C): plan predicted 16 min 20 s; recorded 20 min 00 s')
  })

  it('the digest mail uses none of the retired words', () => {
    const mail = digestMail('digest:2026-03-04', ['qa@kestrelbay.example'], [{ id: 7, loadNumber: 'KB-2026-00117', releasedAt: '2026-03-02T09:00:00Z', plan: 'Shaft 40', furnace: 'Pit 2', deviations: 1 }], (id) => `https://slakewise.example/records/${id}`)
    expect(retiredWordsIn(`${mail.subject}\n${mail.html}\n${mail.text}`)).toEqual([])
  })

  it('the README uses none of the retired words', () => {
    expect(retiredWordsIn(readFileSync('README.md', 'utf8'))).toEqual([])
  })
})
