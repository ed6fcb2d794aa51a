import { z } from 'zod'
import { floorBatches } from '../../schedule/batchReads'

const Query = z.object({ furnaceId: z.coerce.number({ message: 'Furnace id must be a number' }).int().positive().optional() })

// Polled every few seconds by each floor tablet: unchanged cards answer 304, and the
// server's clock travels in a header so a 304 still corrects the tablet's clock.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'floor.view')
  const { furnaceId } = queryValid(event, Query)
  const floor = await floorBatches(furnaceId)
  const { serverNow, ...cards } = floor
  setResponseHeader(event, 'x-server-now', String(serverNow))
  const cardsJson = JSON.stringify(cards)
  if (answeredUnchanged(event, cardsJson)) return null
  // The body is the same JSON with the clock in front: serialised once (about 50 µs for
  // 40 cards), not a second time by h3 on every poll of every tablet.
  setResponseHeader(event, 'content-type', 'application/json')
  return `{"serverNow":${serverNow},${cardsJson.slice(1)}`
})
