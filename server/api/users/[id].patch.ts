import { userUpdateSchema } from '../../../shared/schemas/user'
import { updateUser } from '../../accounts/users'

const Params = idParams('User')

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'people.manage')
  const { id } = await paramsValid(event, Params)
  const change = await readValid(event, userUpdateSchema)
  return await updateUser(id, change, admin.id)
})
