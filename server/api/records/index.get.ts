import { recordListQuerySchema } from '../../../shared/schemas/records'
import { listRecords } from '../../records/service'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'records.read')
  return await listRecords(queryValid(event, recordListQuerySchema))
})
