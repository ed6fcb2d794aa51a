import { z } from 'zod'
import { userUpdateSchema } from '../../../shared/schemas/user'

const Params = z.object({ id: z.coerce.number({ message: 'User id must be a number' }).int().positive('User id must be positive') })

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const { id } = await paramsValid(event, Params)
  const change = await readValid(event, userUpdateSchema)
  return await updateUser(id, change, admin.id)
})
