import { rejectInputSchema } from '../../../../shared/schemas/records'
import { signRecord } from '../../../records/service'

const Params = idParams('Record')

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'records.signOff')
  const { id } = await paramsValid(event, Params)
  const { comment } = await readValid(event, rejectInputSchema)
  return await signRecord(id, 'rejected', comment, user, useShopConfig())
})
