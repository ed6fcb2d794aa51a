import { recordListQuerySchema } from '../../../shared/schemas/records'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'records.read')
  return await listRecords(queryValid(event, recordListQuerySchema))
})
