import { bookingMoveSchema } from '../../../shared/schemas/schedule'
import { moveBooking } from '../../schedule/booking'

const Params = idParams('Load')

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'schedule.book')
  const { id } = await paramsValid(event, Params)
  const input = await readValid(event, bookingMoveSchema)
  return await moveBooking(id, input, user)
})
