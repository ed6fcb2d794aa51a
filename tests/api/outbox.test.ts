/**
 * The mail outbox end to end: HTTP → MariaDB outbox row → worker → SMTP → maildev, read
 * back through maildev's API. The admin's test sheet (POST /api/outbox/test-sheet) is the
 * message here, so outages can be played without releasing loads; real releases are
 * covered in tests/api/records.test.ts.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { anonymous, signInDemo, type Client } from '../support/http'
import { caughtAttachment, caughtMail, clearCaughtMail, startMailCatcher, stopMailCatcher, waitForMail } from '../support/mailCatcher'
import { STANDARD_CAUTIONS } from '../../server/records/cautions'
import { escapeHtml } from '../../server/records/sheetHtml'
import { CURVE_CSV_HEADER } from '../../server/records/sheetCsv'
import { auditFor } from '../support/audit'
import { pause, until } from '../support/poll'

let admin: Client
/** Active users by role, sorted: the default recipients (other test files add people). */
let activeByRole: Record<string, string[]>

beforeAll(async () => {
  admin = await signInDemo('admin')
  const people = (await admin.request('/api/users')).body as { email: string; role: string; active: boolean }[]
  activeByRole = {}
  for (const person of people.filter((p) => p.active)) (activeByRole[person.role] ??= []).push(person.email)
  for (const list of Object.values(activeByRole)) list.sort()
})

async function outbox(query = 'limit=500') {
  const response = await admin.request(`/api/outbox?${query}`)
  expect(response.status).toBe(200)
  return response.body as {
    counts: Record<string, number>
    messages: {
      id: number
      subject: string
      status: string
      attempts: number
      lastError: string | null
      sentAt: string | null
      to: string[]
      attachments: { filename: string; bytes: number }[]
    }[]
  }
}

describe('role matrix for the outbox and recipients routes', () => {
  const routes = [
    { method: 'GET', path: '/api/outbox' },
    { method: 'POST', path: '/api/outbox/1/retry' },
    { method: 'POST', path: '/api/outbox/test-sheet', body: {} },
    { method: 'GET', path: '/api/mail-recipients' },
    { method: 'PUT', path: '/api/mail-recipients/rejection', body: { emails: [], includeRoleDefault: true } },
  ]
  it.each(routes)('$method $path: 401 signed out', async ({ method, path, body }) => {
    expect((await anonymous().request(path, { method, body })).status).toBe(401)
  })
  it.each(['metallurgist', 'operator', 'qa'] as const)('403 for %s on every route', async (role) => {
    const client = await signInDemo(role)
    for (const { method, path, body } of routes) {
      const response = await client.request(path, { method, body })
      expect(response.status, `${method} ${path}`).toBe(403)
      expect(response.body.statusMessage).toBe('Not allowed for your role')
    }
  })
})

describe('a hold-time sheet by e-mail', () => {
  it('arrives exactly once, to the active QA leads by default, with the PDF and the curve CSV', async () => {
    await clearCaughtMail()
    const first = await admin.request('/api/outbox/test-sheet', { method: 'POST', body: { loadNumber: 'KB-API-0001', dedupeKey: 'api-once' } })
    expect(first.status).toBe(201)
    expect(first.body).toMatchObject({ created: true, loadNumber: 'KB-API-0001', dedupeKey: 'test-sheet:api-once' })
    expect([...first.body.to].sort()).toEqual(activeByRole.qa)
    expect(activeByRole.qa).toContain('qa@kestrelbay.example')

    // The same dedupe key again (a retried request) queues nothing new.
    const again = await admin.request('/api/outbox/test-sheet', { method: 'POST', body: { loadNumber: 'KB-API-0001', dedupeKey: 'api-once' } })
    expect(again.status).toBe(200)
    expect(again.body).toMatchObject({ created: false, id: first.body.id })

    const [mail] = await waitForMail((m) => m.subject.includes('KB-API-0001'), 1)
    expect(mail!.subject).toBe('Hold-time sheet · Load KB-API-0001 · Drive flange · 1 deviation')
    expect(mail!.to.map((to) => to.address).sort()).toEqual(activeByRole.qa)
    expect(mail!.html).toContain('Load KB-API-0001')
    expect(mail!.html).toContain('Quench delay 52 s from the furnace door opening to the quench, 22 s over the allowed 30 s.')
    for (const caution of STANDARD_CAUTIONS) expect(mail!.html).toContain(escapeHtml(caution))
    expect(mail!.text).toContain('Load KB-API-0001')

    const files = Object.fromEntries((mail!.attachments ?? []).map((file) => [file.filename, file]))
    expect(Object.keys(files).sort()).toEqual(['cooldown-curve-KB-API-0001.csv', 'hold-time-sheet-KB-API-0001.pdf'])
    expect(files['hold-time-sheet-KB-API-0001.pdf']!.contentType).toBe('application/pdf')
    const pdf = await caughtAttachment(mail!, files['hold-time-sheet-KB-API-0001.pdf']!.generatedFileName)
    expect(pdf.length).toBe(files['hold-time-sheet-KB-API-0001.pdf']!.size)
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    // Page text is compressed in the mailed PDF; the document title (info dictionary) is not.
    expect(pdf.toString('latin1')).toContain('(Hold-time sheet, load KB-API-0001)')
    const csv = (await caughtAttachment(mail!, files['cooldown-curve-KB-API-0001.csv']!.generatedFileName)).toString('utf8')
    expect(csv.split('\r\n').slice(0, 3)).toEqual([CURVE_CSV_HEADER, '0.0,0.00,850.0', '30.0,0.50,790.0'])

    const row = (await outbox()).messages.find((message) => message.id === first.body.id)!
    expect(row).toMatchObject({ status: 'sent', attempts: 1, lastError: null })
    expect([...row.to].sort()).toEqual(activeByRole.qa)
    expect(row.attachments.map((file) => file.filename)).toEqual(['hold-time-sheet-KB-API-0001.pdf', 'cooldown-curve-KB-API-0001.csv'])
    expect(row.attachments[0]!.bytes).toBe(pdf.length)

    // Several more worker passes later it is still one message.
    await pause(1500)
    expect((await caughtMail()).filter((m) => m.subject.includes('KB-API-0001'))).toHaveLength(1)
  })

  it('with the mail catcher down, 20 sheets stay queued with the error; when it is back all 20 arrive exactly once', { timeout: 90_000 }, async () => {
    await stopMailCatcher()
    try {
      const ids: number[] = []
      for (let n = 1; n <= 20; n += 1) {
        const response = await admin.request('/api/outbox/test-sheet', { method: 'POST', body: { loadNumber: `KB-OUT-${String(n).padStart(2, '0')}` } })
        expect(response.status).toBe(201)
        ids.push(response.body.id)
      }
      const waiting = await until(
        async () => (await outbox()).messages.filter((message) => ids.includes(message.id)),
        (rows) => rows.length === 20 && rows.every((row) => row.status === 'queued' && row.attempts >= 2),
      )
      for (const row of waiting) {
        expect(row.lastError).toMatch(/ECONNREFUSED|ECONNECTION/)
        expect(row.sentAt).toBeNull()
      }
    } finally {
      await startMailCatcher()
    }
    const arrived = await waitForMail((m) => m.subject.includes('KB-OUT-'), 20, 30)
    await pause(1500)
    const all = (await caughtMail()).filter((m) => m.subject.includes('KB-OUT-'))
    expect(all).toHaveLength(20)
    const loads = all.map((m) => /Load (KB-OUT-\d\d)/.exec(m.subject)![1]).sort()
    expect(loads).toEqual(Array.from({ length: 20 }, (_, i) => `KB-OUT-${String(i + 1).padStart(2, '0')}`))
    expect(arrived.every((m) => (m.attachments ?? []).length === 2)).toBe(true)

    const rows = (await outbox()).messages.filter((message) => message.subject.includes('KB-OUT-'))
    expect(rows.map((row) => row.status)).toEqual(Array(20).fill('sent'))
    expect(rows.every((row) => row.lastError === null && row.sentAt !== null)).toBe(true)
  })
})

describe('retry', () => {
  it('refuses a sent message with 409, an unknown one with 404 and a bad id with 400 naming it', async () => {
    const sent = (await outbox('status=sent&limit=1')).messages[0]!
    const again = await admin.request(`/api/outbox/${sent.id}/retry`, { method: 'POST' })
    expect(again.status).toBe(409)
    expect(again.body.statusMessage).toBe('Message already sent')
    expect((await admin.request('/api/outbox/999999/retry', { method: 'POST' })).status).toBe(404)
    const bad = await admin.request('/api/outbox/abc/retry', { method: 'POST' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems).toEqual([{ field: 'id', message: 'Message id must be a number' }])
  })

  it('a message the server refused is failed at once, and a retry sends it', { timeout: 60_000 }, async () => {
    // A catcher that demands SMTP authentication answers 530 to our unauthenticated mail: a permanent refusal.
    await startMailCatcher(['--incoming-user', 'records', '--incoming-pass', 'not-configured'])
    let id: number
    try {
      id = (await admin.request('/api/outbox/test-sheet', { method: 'POST', body: { loadNumber: 'KB-REFUSED-1' } })).body.id
      const failed = await until(async () => (await outbox()).messages.find((message) => message.id === id)!, (row) => row.status === 'failed')
      expect(failed.attempts).toBe(1)
      expect(failed.lastError).toMatch(/^EENVELOPE 530/)
    } finally {
      await startMailCatcher()
    }
    await pause(1000)
    expect((await outbox()).messages.find((message) => message.id === id)!.status).toBe('failed')

    const retried = await admin.request(`/api/outbox/${id}/retry`, { method: 'POST' })
    expect(retried.status).toBe(200)
    expect(retried.body).toMatchObject({ id, status: 'queued', attempts: 0 })
    await waitForMail((m) => m.subject.includes('KB-REFUSED-1'), 1)
    const sent = await until(async () => (await outbox()).messages.find((message) => message.id === id)!, (row) => row.status === 'sent')
    expect(sent.attempts).toBe(1)

    const entry = (await auditFor(admin, 'outbox_message', id)).find((row: { action: string }) => row.action === 'outbox.retry')
    expect(entry.details).toMatchObject({ from: 'failed', attempts: 1 })
    expect(entry.actorName).toBe('Rowan Achterberg')
  })
})

describe('mail recipients', () => {
  it('defaults to the active users of each role', async () => {
    const response = await admin.request('/api/mail-recipients')
    expect(response.status).toBe(200)
    const settings = response.body as { kind: string; defaultRole: string; effective: string[] }[]
    expect(settings.map((setting) => [setting.kind, setting.defaultRole, [...setting.effective].sort()])).toEqual([
      ['released_sheet', 'qa', activeByRole.qa],
      ['rejection', 'metallurgist', activeByRole.metallurgist],
      ['daily_digest', 'qa', activeByRole.qa],
    ])
  })

  it('round trip: saved, normalised, read back, audited, and used for the next sheet', async () => {
    const saved = await admin.request('/api/mail-recipients/released_sheet', {
      method: 'PUT',
      body: { emails: ['Records@Customer.example', 'records@customer.example', 'line2@kestrelbay.example'], includeRoleDefault: false },
    })
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject({
      kind: 'released_sheet',
      emails: ['records@customer.example', 'line2@kestrelbay.example'],
      includeRoleDefault: false,
      effective: ['records@customer.example', 'line2@kestrelbay.example'],
    })
    const listed = (await admin.request('/api/mail-recipients')).body.find((setting: { kind: string }) => setting.kind === 'released_sheet')
    expect(listed).toEqual(saved.body)

    const audit = await admin.request('/api/audit?entityType=mail_recipients&limit=5')
    expect(audit.body[0]).toMatchObject({
      action: 'mail_recipients.update',
      entityId: 'released_sheet',
      actorName: 'Rowan Achterberg',
      details: {
        emails: { from: [], to: ['records@customer.example', 'line2@kestrelbay.example'] },
        includeRoleDefault: { from: true, to: false },
      },
    })

    const queued = await admin.request('/api/outbox/test-sheet', { method: 'POST', body: { loadNumber: 'KB-RCPT-1' } })
    expect(queued.body.to).toEqual(['records@customer.example', 'line2@kestrelbay.example'])
    const [mail] = await waitForMail((m) => m.subject.includes('KB-RCPT-1'), 1)
    expect(mail!.to.map((to) => to.address).sort()).toEqual(['line2@kestrelbay.example', 'records@customer.example'])

    const restored = await admin.request('/api/mail-recipients/released_sheet', { method: 'PUT', body: { emails: [], includeRoleDefault: true } })
    expect([...restored.body.effective].sort()).toEqual(activeByRole.qa)
  })

  it('400 naming each bad field', async () => {
    const bad = await admin.request('/api/mail-recipients/rejection', { method: 'PUT', body: { emails: ['ok@kestrelbay.example', 'not-an-address'], includeRoleDefault: 'yes' } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems).toEqual([
      { field: 'emails.1', message: 'Enter a valid e-mail address' },
      { field: 'includeRoleDefault', message: 'Yes or no: also send to the active users of the default role' },
    ])
    const kind = await admin.request('/api/mail-recipients/weekly', { method: 'PUT', body: { emails: [], includeRoleDefault: true } })
    expect(kind.status).toBe(400)
    expect(kind.body.data.problems).toEqual([{ field: 'kind', message: 'Kind must be one of released_sheet, rejection, daily_digest' }])
    const extra = await admin.request('/api/mail-recipients/rejection', { method: 'PUT', body: { emails: [], includeRoleDefault: true, cc: 'x' } })
    expect(extra.status).toBe(400)
    expect(extra.body.data.problems[0].field).toBe('(body)')

    const sheet = await admin.request('/api/outbox/test-sheet', { method: 'POST', body: { loadNumber: 'bad number!', to: ['nope'] } })
    expect(sheet.status).toBe(400)
    expect(sheet.body.data.problems.map((problem: { field: string }) => problem.field)).toEqual(['loadNumber', 'to.0'])
  })
})
