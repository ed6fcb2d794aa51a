import { settingsUpdateSchema } from '../../../shared/schemas/schedule'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'equipment.manage')
  const change = await readValid(event, settingsUpdateSchema)
  return await updateShopSettings(change, admin.id)
})
