import { listUsers } from '../../accounts/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'people.manage')
  return await listUsers()
})
