import { PlanIdParams, getPlan } from '../../../planning/plans'

export default defineEventHandler(async (event) => {
  await requireRole(event)
  const { id } = await paramsValid(event, PlanIdParams)
  return await getPlan(id)
})
