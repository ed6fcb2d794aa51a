import { z } from 'zod'
import { stationUpdateSchema } from '../../../shared/schemas/schedule'

const Params = z.object({ id: z.coerce.number({ message: 'Station id must be a number' }).int().positive('Station id must be positive') })

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const { id } = await paramsValid(event, Params)
  const change = await readValid(event, stationUpdateSchema)
  return await saveStation(id, change, admin.id)
})
