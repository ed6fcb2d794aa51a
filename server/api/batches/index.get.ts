import { batchQuerySchema } from '../../../shared/schemas/schedule'
import { listBatches } from '../../schedule/batchReads'

const MAX_SPAN_MS = 45 * 24 * 3600_000

export default defineEventHandler(async (event) => {
  await requireRole(event, 'schedule.read')
  const query = queryValid(event, batchQuerySchema)
  const from = new Date(query.from)
  const to = new Date(query.to)
  if (!(to > from) || to.getTime() - from.getTime() > MAX_SPAN_MS) {
    throw createError({ statusCode: 400, statusMessage: 'Invalid query', data: { problems: [{ field: 'to', message: 'to must be after from and at most 45 days later' }] } })
  }
  return await listBatches(from, to, query.furnaceId)
})
