import { stationUpdateSchema } from '../../../shared/schemas/schedule'
import { saveStation } from '../../schedule/equipment'

const Params = idParams('Station')

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'equipment.manage')
  const { id } = await paramsValid(event, Params)
  const change = await readValid(event, stationUpdateSchema)
  return await saveStation(id, change, admin.id)
})
