import { randomUUID } from 'node:crypto'
import { z } from 'zod'
import { sampleHoldTimeSheet } from '../../records/sampleSheet'
import { holdTimeSheetMail } from '../../records/sheetMail'
import { recipientsFor } from '../../outbox/mailRecipients'
import { enqueueMail } from '../../outbox/enqueue'

const Body = z.strictObject({
  loadNumber: z
    .string({ message: 'Load number must be text' })
    .regex(/^[A-Za-z0-9][A-Za-z0-9._-]{0,39}$/, 'Letters, digits, dot, dash or underscore, at most 40')
    .default('KB-DEMO-0001'),
  to: z.array(z.email({ message: 'Enter a valid e-mail address' }), { message: 'Send a list of e-mail addresses' }).min(1, 'At least one address').max(20).optional(),
  dedupeKey: z.string({ message: 'Dedupe key must be text' }).min(1).max(150).optional(),
})

/**
 * Admin "send a test sheet": queues the hold-time sheet of a fictional Kestrel Bay load,
 * PDF and CSV attached, to the released-sheet recipients (or `to`), so an administrator
 * can check the mail server and the recipients before a real release depends on them.
 * Real sheets are queued by the release itself (server/records/service.ts).
 */
export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'outbox.manage')
  const body = await readValid(event, Body)
  const sheet = sampleHoldTimeSheet({ loadNumber: body.loadNumber, shopName: useShopConfig().shopName })
  const dedupeKey = `test-sheet:${body.dedupeKey ?? randomUUID()}`
  // Rendered before the transaction so the PDF work does not hold row locks.
  const mail = await holdTimeSheetMail(sheet, [], dedupeKey)
  const result = await useDb().transaction(async (tx) => {
    const to = body.to ?? (await recipientsFor(tx, 'released_sheet'))
    if (to.length === 0) {
      throw createError({
        statusCode: 422,
        statusMessage: 'Nobody receives released-load sheets',
        data: { problems: [{ field: 'to', message: 'Name recipients here or configure them under Mail recipients' }] },
      })
    }
    const queued = await enqueueMail(tx, { ...mail, to })
    if (queued.created) {
      await recordAudit(tx, { actorId: admin.id, action: 'outbox.test_sheet', entityType: 'outbox_message', entityId: queued.id, details: { loadNumber: sheet.loadNumber, to } })
    }
    return { ...queued, to, loadNumber: sheet.loadNumber, dedupeKey }
  })
  setResponseStatus(event, result.created ? 201 : 200)
  return result
})
