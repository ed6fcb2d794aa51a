import { listPlans } from '../../planning/plans'

export default defineEventHandler(async (event) => {
  await requireRole(event)
  return await listPlans()
})
