import { quenchantInputSchema } from '../../../shared/schemas/quenchant'
import { createQuenchant } from '../../library/quenchants'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'library.edit')
  const input = await readValid(event, quenchantInputSchema)
  setResponseStatus(event, 201)
  return await createQuenchant(input, user.id)
})
