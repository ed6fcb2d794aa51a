import { retryOutboxMessage } from '../../../outbox/messages'

const Params = idParams('Message')

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'outbox.manage')
  const { id } = await paramsValid(event, Params)
  return await retryOutboxMessage(id, admin.id)
})
