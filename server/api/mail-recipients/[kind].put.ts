import { z } from 'zod'
import { mailRecipientKindSchema, mailRecipientsUpdateSchema } from '../../../shared/schemas/mailRecipients'
import { updateRecipientSetting } from '../../outbox/mailRecipients'

const Params = z.object({ kind: mailRecipientKindSchema })

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'mail.manage')
  const { kind } = await paramsValid(event, Params)
  const change = await readValid(event, mailRecipientsUpdateSchema)
  return await updateRecipientSetting(kind, change, admin.id)
})
