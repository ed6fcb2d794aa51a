import { ownPasswordSchema } from '../../../shared/schemas/user'
import { requireSignedInId } from '../../security/signedIn'
import { changeOwnPassword } from '../../accounts/ownPassword'

export default defineEventHandler(async (event) => {
  const userId = await requireSignedInId(event)
  const change = await readValid(event, ownPasswordSchema)
  await changeOwnPassword(userId, change)
  setResponseStatus(event, 204)
  return null
})
