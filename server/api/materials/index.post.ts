import { materialInputSchema } from '../../../shared/schemas/material'
import { createMaterial } from '../../library/materials'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'library.edit')
  const input = await readValid(event, materialInputSchema)
  setResponseStatus(event, 201)
  return await createMaterial(input, user.id)
})
