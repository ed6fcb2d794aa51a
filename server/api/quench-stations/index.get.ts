export default defineEventHandler(async (event) => {
  await requireRole(event)
  return await listStations()
})
