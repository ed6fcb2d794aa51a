import { listUsers } from '../../accounts/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, ['admin'])
  return await listUsers()
})
