import { z } from 'zod'
import { listLogs } from '../../measurements/logStore'

const Query = z.object({ batchId: positiveId('Load').optional() })

export default defineEventHandler(async (event) => {
  await requireRole(event, 'logs.read')
  const { batchId } = queryValid(event, Query)
  return await listLogs(batchId)
})
