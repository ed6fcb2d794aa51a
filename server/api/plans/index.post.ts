import { planSpecSchema } from '../../../shared/schemas/plan'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ['metallurgist', 'admin'])
  const spec = await readValid(event, planSpecSchema)
  setResponseStatus(event, 201)
  return await createPlan(spec, user.id)
})
