import { z } from 'zod'

const Params = z.object({ id: z.coerce.number({ message: 'Message id must be a number' }).int().positive('Message id must be positive') })

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const { id } = await paramsValid(event, Params)
  return await retryOutboxMessage(id, admin.id)
})
