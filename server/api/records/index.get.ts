import { recordListQuerySchema } from '../../../shared/schemas/records'

export default defineEventHandler(async (event) => {
  await requireRole(event, ['qa', 'metallurgist', 'admin'])
  return await listRecords(queryValid(event, recordListQuerySchema))
})
