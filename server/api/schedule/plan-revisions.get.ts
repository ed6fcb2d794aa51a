export default defineEventHandler(async (event) => {
  await requireRole(event, ['metallurgist', 'admin'])
  return await planOptions()
})
