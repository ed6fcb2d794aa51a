import { planListQuerySchema } from '../../../shared/schemas/plan'
import { listPlans } from '../../planning/plans'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'plans.read')
  return await listPlans(queryValid(event, planListQuerySchema))
})
