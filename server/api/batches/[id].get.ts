import { getBatch } from '../../schedule/batchReads'

const Params = idParams('Load')

export default defineEventHandler(async (event) => {
  await requireRole(event, 'schedule.read')
  const { id } = await paramsValid(event, Params)
  return await getBatch(id)
})
