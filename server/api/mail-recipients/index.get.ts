import { listRecipientSettings } from '../../outbox/mailRecipients'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'mail.manage')
  return await listRecipientSettings()
})
