import { PlanRevisionParams, getPlan } from '../../../../planning/plans'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'plans.read')
  const { id, revision } = await paramsValid(event, PlanRevisionParams)
  return await getPlan(id, revision)
})
