import { z } from 'zod'
import { curveCsv } from '../../../planning/computePlan'
import { PlanIdParams, getPlan } from '../../../planning/plans'

const Query = z.object({
  revision: z.coerce.number({ message: 'Revision must be a number' }).int().positive('Revision must be positive').optional(),
  temperature: z.enum(['C', 'F'], { message: 'Temperature unit must be C or F' }).default('C'),
})

export default defineEventHandler(async (event) => {
  await requireRole(event, 'plans.read')
  const { id } = await paramsValid(event, PlanIdParams)
  const { revision, temperature } = queryValid(event, Query)
  const plan = await getPlan(id, revision)
  const file = `plan-${plan.id}-rev${plan.revision}-curve.csv`
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${file}"`)
  return curveCsv(plan.result, temperature)
})
