import { settingsUpdateSchema } from '../../../shared/schemas/schedule'
import { updateShopSettings } from '../../schedule/shopSettings'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'equipment.manage')
  const change = await readValid(event, settingsUpdateSchema)
  return await updateShopSettings(change, admin.id)
})
