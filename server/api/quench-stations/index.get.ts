import { listStations } from '../../schedule/equipment'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'equipment.read')
  return await listStations()
})
