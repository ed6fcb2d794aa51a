import { rejectInputSchema } from '../../../../shared/schemas/records'
import { RecordParams } from '../../../utils/recordParams'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ['qa'])
  const { id } = await paramsValid(event, RecordParams)
  const { comment } = await readValid(event, rejectInputSchema)
  return await signRecord(id, 'rejected', comment, user)
})
