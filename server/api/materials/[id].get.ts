import { libraryIdParams } from '../../library/library'
import { getMaterial } from '../../library/materials'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'library.read')
  const { id } = await paramsValid(event, libraryIdParams)
  return await getMaterial(id)
})
