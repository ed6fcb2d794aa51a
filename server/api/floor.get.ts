import { z } from 'zod'
import { floorBatches } from '../schedule/batchReads'

const Query = z.object({ furnaceId: z.coerce.number({ message: 'Furnace id must be a number' }).int().positive().optional() })

export default defineEventHandler(async (event) => {
  await requireRole(event, 'floor.view')
  const { furnaceId } = queryValid(event, Query)
  return await floorBatches(furnaceId)
})
