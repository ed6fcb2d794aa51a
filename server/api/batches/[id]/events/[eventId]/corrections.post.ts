import { z } from 'zod'
import { correctionInputSchema } from '../../../../../../shared/schemas/schedule'
import { correctEvent } from '../../../../../schedule/corrections'

const Params = z.object({ id: positiveId('Batch'), eventId: positiveId('Event') })

export default defineEventHandler(async (event) => {
  // Operators within the shop's window, metallurgists and QA leads until sign-off: correctEvent decides.
  const user = await requireRole(event, 'signedIn')
  const { id, eventId } = await paramsValid(event, Params)
  const input = await readValid(event, correctionInputSchema)
  setResponseStatus(event, 201)
  return await correctEvent(id, eventId, input, user, useShopConfig())
})
