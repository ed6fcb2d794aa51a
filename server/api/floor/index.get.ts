import { z } from 'zod'
import { floorBatches } from '../../schedule/batchReads'

const Query = z.object({ furnaceId: z.coerce.number({ message: 'Furnace id must be a number' }).int().positive().optional() })

// Polled every few seconds by each floor tablet: unchanged cards answer 304, and the
// server's clock travels in a header so a 304 still corrects the tablet's clock.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'floor.view')
  const { furnaceId } = queryValid(event, Query)
  const floor = await floorBatches(furnaceId)
  setResponseHeader(event, 'x-server-now', String(floor.serverNow))
  if (answeredUnchanged(event, { settings: floor.settings, plans: floor.plans, batches: floor.batches })) return null
  return floor
})
