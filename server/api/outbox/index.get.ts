import { z } from 'zod'
import { OUTBOX_STATUSES } from '../../../shared/types/outbox'
import { listOutbox } from '../../outbox/messages'

const Query = z.object({
  status: z.enum(OUTBOX_STATUSES, { message: `Status must be one of ${OUTBOX_STATUSES.join(', ')}` }).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
})

export default defineEventHandler(async (event) => {
  await requireRole(event, 'outbox.manage')
  return await listOutbox(queryValid(event, Query))
})
