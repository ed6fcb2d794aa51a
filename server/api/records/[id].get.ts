import { RecordParams } from '../../utils/recordParams'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ['qa', 'metallurgist', 'admin'])
  const { id } = await paramsValid(event, RecordParams)
  return await getRecord(id, user)
})
