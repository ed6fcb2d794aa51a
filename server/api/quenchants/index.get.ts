import { listQuenchants } from '../../library/quenchants'

// Every signed-in role reads the library: operators and QA see what plans were built on.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'library.read')
  return await listQuenchants()
})
