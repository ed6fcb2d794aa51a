import { queueDailyDigest } from '../../records/service'

export default defineEventHandler(async (event) => {
  // The worker queues the digest on its own once a day; this lets an admin (and the tests) ask now.
  const admin = await requireRole(event, 'records.digest')
  const result = await queueDailyDigest(useDb(), new Date(), useShopConfig(), admin.id)
  setResponseStatus(event, result.created ? 201 : 200)
  return result
})
