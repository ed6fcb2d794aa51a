import { moveInputSchema } from '../../../../shared/schemas/schedule'
import { moveBatch } from '../../../schedule/moves'

const Params = idParams('Load')

export default defineEventHandler(async (event) => {
  // Which role may record which move depends on the move; moveBatch checks it.
  const user = await requireRole(event, 'signedIn')
  const { id } = await paramsValid(event, Params)
  const { to, acknowledgeShortfall } = await readValid(event, moveInputSchema)
  const result = await moveBatch(id, to, user, useShopConfig(), { acknowledgeShortfall })
  setResponseStatus(event, result.repeated ? 200 : 201)
  return result
})
