import { userCreateSchema } from '../../../shared/schemas/user'
import { createUser } from '../../accounts/users'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'people.manage')
  const input = await readValid(event, userCreateSchema)
  setResponseStatus(event, 201)
  return await createUser(input, admin.id)
})
