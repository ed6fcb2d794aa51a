import { bookingInputSchema } from '../../../shared/schemas/schedule'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ['metallurgist', 'admin'])
  const input = await readValid(event, bookingInputSchema)
  setResponseStatus(event, 201)
  return await bookBatch(input, user)
})
