import { furnaceUpdateSchema } from '../../../shared/schemas/schedule'
import { saveFurnace } from '../../schedule/equipment'

const Params = idParams('Furnace')

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'equipment.manage')
  const { id } = await paramsValid(event, Params)
  const change = await readValid(event, furnaceUpdateSchema)
  return await saveFurnace(id, change, admin.id)
})
