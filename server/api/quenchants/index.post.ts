import { quenchantInputSchema } from '../../../shared/schemas/quenchant'
import { LIBRARY_EDIT_ROLES } from '../../../shared/library'
import { createQuenchant } from '../../library/quenchants'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, LIBRARY_EDIT_ROLES)
  const input = await readValid(event, quenchantInputSchema)
  setResponseStatus(event, 201)
  return await createQuenchant(input, user.id)
})
