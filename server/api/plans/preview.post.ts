import { planSpecSchema } from '../../../shared/schemas/plan'
import { previewPlan } from '../../planning/plans'

// Computes without saving: the editor calls this (debounced) as inputs change. Any role may look.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'plans.read')
  const spec = await readValid(event, planSpecSchema)
  return await previewPlan(spec)
})
