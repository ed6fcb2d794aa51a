import { listRecipientSettings } from '../../outbox/mailRecipients'

export default defineEventHandler(async (event) => {
  await requireRole(event, ['admin'])
  return await listRecipientSettings()
})
