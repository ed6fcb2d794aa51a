import { libraryIdParams } from '../../library/library'

export default defineEventHandler(async (event) => {
  await requireRole(event)
  const { id } = await paramsValid(event, libraryIdParams)
  return await getQuenchant(id)
})
