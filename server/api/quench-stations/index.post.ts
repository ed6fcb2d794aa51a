import { stationInputSchema } from '../../../shared/schemas/schedule'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'equipment.manage')
  const input = await readValid(event, stationInputSchema)
  setResponseStatus(event, 201)
  return await saveStation(null, input, admin.id)
})
