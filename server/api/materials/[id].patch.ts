import { materialPatchSchema } from '../../../shared/schemas/material'
import { LIBRARY_EDIT_ROLES } from '../../../shared/library'
import { libraryIdParams } from '../../library/library'
import { updateMaterial } from '../../library/materials'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, LIBRARY_EDIT_ROLES)
  const { id } = await paramsValid(event, libraryIdParams)
  const patch = await readValid(event, materialPatchSchema)
  return await updateMaterial(id, patch, user.id)
})
