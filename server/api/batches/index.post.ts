import { bookingInputSchema } from '../../../shared/schemas/schedule'
import { bookBatch } from '../../schedule/booking'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'schedule.book')
  const input = await readValid(event, bookingInputSchema)
  setResponseStatus(event, 201)
  return await bookBatch(input, user, useShopConfig())
})
