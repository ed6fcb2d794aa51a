import { planSpecSchema } from '../../../shared/schemas/plan'
import { previewPlanJson } from '../../planning/plans'

// Computes without saving: the editor calls this (debounced) as inputs change. Any role may look.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'plans.read')
  const spec = await readValid(event, planSpecSchema)
  const json = await previewPlanJson(spec)
  // Already JSON text: h3 would label a string as HTML.
  setResponseHeader(event, 'content-type', 'application/json')
  return json
})
