const Params = idParams('Batch')

export default defineEventHandler(async (event) => {
  await requireRole(event)
  const { id } = await paramsValid(event, Params)
  return await getBatch(id)
})
