import { getRecord } from '../../records/service'

const Params = idParams('Record')

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'records.read')
  const { id } = await paramsValid(event, Params)
  return await getRecord(id, user, useShopConfig())
})
