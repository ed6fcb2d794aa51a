import { planRevisionInputSchema } from '../../../shared/schemas/plan'
import { createPlan } from '../../planning/plans'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'plans.edit')
  const { note, ...spec } = await readValid(event, planRevisionInputSchema)
  setResponseStatus(event, 201)
  return await createPlan(spec, user.id, note)
})
