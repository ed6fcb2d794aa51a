import { approveInputSchema } from '../../../../shared/schemas/records'
import { signRecord } from '../../../records/service'

const Params = idParams('Record')

export default defineEventHandler(async (event) => {
  // Only QA signs; who else is refused (a QA lead who worked the load) is decided in signRecord.
  const user = await requireRole(event, 'records.signOff')
  const { id } = await paramsValid(event, Params)
  const { comment } = await readValid(event, approveInputSchema)
  return await signRecord(id, 'approved', comment, user, useShopConfig())
})
