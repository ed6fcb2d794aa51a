import { materialInputSchema } from '../../../shared/schemas/material'
import { LIBRARY_EDIT_ROLES } from '../../../shared/library'
import { createMaterial } from '../../library/materials'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, LIBRARY_EDIT_ROLES)
  const input = await readValid(event, materialInputSchema)
  setResponseStatus(event, 201)
  return await createMaterial(input, user.id)
})
