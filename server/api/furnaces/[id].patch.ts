import { z } from 'zod'
import { furnaceUpdateSchema } from '../../../shared/schemas/schedule'

const Params = z.object({ id: z.coerce.number({ message: 'Furnace id must be a number' }).int().positive('Furnace id must be positive') })

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const { id } = await paramsValid(event, Params)
  const change = await readValid(event, furnaceUpdateSchema)
  return await saveFurnace(id, change, admin.id)
})
