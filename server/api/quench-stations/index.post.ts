import { stationInputSchema } from '../../../shared/schemas/schedule'
import { saveStation } from '../../schedule/equipment'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'equipment.manage')
  const input = await readValid(event, stationInputSchema)
  setResponseStatus(event, 201)
  return await saveStation(null, input, admin.id)
})
