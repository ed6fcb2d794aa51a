import { materialPatchSchema } from '../../../shared/schemas/material'
import { libraryIdParams } from '../../library/library'
import { updateMaterial } from '../../library/materials'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'library.edit')
  const { id } = await paramsValid(event, libraryIdParams)
  const patch = await readValid(event, materialPatchSchema)
  return await updateMaterial(id, patch, user.id)
})
