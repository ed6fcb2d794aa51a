import { PlanIdParams, getPlan } from '../../../planning/plans'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'plans.read')
  const { id } = await paramsValid(event, PlanIdParams)
  return await getPlan(id)
})
