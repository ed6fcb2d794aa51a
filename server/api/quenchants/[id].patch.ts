import { quenchantPatchSchema } from '../../../shared/schemas/quenchant'
import { libraryIdParams } from '../../library/library'
import { updateQuenchant } from '../../library/quenchants'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'library.edit')
  const { id } = await paramsValid(event, libraryIdParams)
  const patch = await readValid(event, quenchantPatchSchema)
  return await updateQuenchant(id, patch, user.id)
})
