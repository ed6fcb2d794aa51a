import { PlanIdParams, duplicatePlan } from '../../../planning/plans'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'plans.edit')
  const { id } = await paramsValid(event, PlanIdParams)
  setResponseStatus(event, 201)
  return await duplicatePlan(id, user.id)
})
