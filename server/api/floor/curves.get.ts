import { z } from 'zod'
import { floorCurves } from '../../schedule/batchReads'

const MAX_IDS = 200
const Query = z.object({
  ids: z
    .string({ message: 'ids must list plan revision ids separated by commas' })
    .regex(/^\d+(,\d+)*$/, 'ids must list plan revision ids separated by commas')
    .transform((list) => [...new Set(list.split(',').map(Number))])
    .refine((ids) => ids.length <= MAX_IDS, `ids may name at most ${MAX_IDS} plan revisions`),
})

// The countdown cards' curves, fetched once per plan revision: a revision never changes, so the browser may keep them.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'floor.view')
  const { ids } = queryValid(event, Query)
  setResponseHeader(event, 'cache-control', 'private, max-age=86400, immutable')
  return await floorCurves(ids)
})
