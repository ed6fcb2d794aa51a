import { furnaceInputSchema } from '../../../shared/schemas/schedule'
import { saveFurnace } from '../../schedule/equipment'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'equipment.manage')
  const input = await readValid(event, furnaceInputSchema)
  setResponseStatus(event, 201)
  return await saveFurnace(null, input, admin.id)
})
