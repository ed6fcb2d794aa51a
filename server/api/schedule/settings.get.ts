import { readShopSettings } from '../../schedule/shopSettings'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'equipment.read')
  return await readShopSettings()
})
