import { z } from 'zod'

const Params = z.object({ id: z.coerce.number({ message: 'Batch id must be a number' }).int().positive('Batch id must be positive') })

export default defineEventHandler(async (event) => {
  await requireRole(event)
  const { id } = await paramsValid(event, Params)
  return await getBatch(id)
})
