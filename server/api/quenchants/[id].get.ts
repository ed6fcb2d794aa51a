import { libraryIdParams } from '../../library/library'
import { getQuenchant } from '../../library/quenchants'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'library.read')
  const { id } = await paramsValid(event, libraryIdParams)
  return await getQuenchant(id)
})
