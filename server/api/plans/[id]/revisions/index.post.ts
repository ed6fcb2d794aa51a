import { planRevisionInputSchema } from '../../../../../shared/schemas/plan'
import { PlanIdParams, addRevision } from '../../../../planning/plans'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'plans.edit')
  const { id } = await paramsValid(event, PlanIdParams)
  const { note, ...spec } = await readValid(event, planRevisionInputSchema)
  setResponseStatus(event, 201)
  // A saved plan is never overwritten: each edit becomes a new revision.
  return await addRevision(id, spec, note, user.id)
})
