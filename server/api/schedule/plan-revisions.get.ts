import { planOptions } from '../../schedule/batchReads'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'schedule.book')
  return await planOptions()
})
