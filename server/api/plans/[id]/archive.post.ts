import { planArchiveSchema } from '../../../../shared/schemas/plan'
import { PlanIdParams, setPlanArchived } from '../../../planning/plans'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'plans.edit')
  const { id } = await paramsValid(event, PlanIdParams)
  const { archived } = await readValid(event, planArchiveSchema)
  return await setPlanArchived(id, archived, user.id)
})
