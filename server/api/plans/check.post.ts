import { planSpecSchema } from '../../../shared/schemas/plan'
import { checkSpec } from '../../planning/plans'

// Re-solves the quench with finite differences and returns the largest difference from the series.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'plans.read')
  const spec = await readValid(event, planSpecSchema)
  return await checkSpec(spec)
})
