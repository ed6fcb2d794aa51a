import { retryOutboxMessage } from '../../../outbox/messages'

const Params = idParams('Message')

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const { id } = await paramsValid(event, Params)
  return await retryOutboxMessage(id, admin.id)
})
