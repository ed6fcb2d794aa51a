import { readLogDetail } from '../../measurements/logStore'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'logs.read')
  const { id } = await paramsValid(event, idParams('Log'))
  return await readLogDetail(id)
})
