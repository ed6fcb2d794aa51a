import { logUploadFieldsSchema } from '../../../shared/schemas/measurementLog'
import { MAX_LOG_BYTES } from '../../measurements/parseLog'
import { storeLog } from '../../measurements/logStore'

// Step two: the same file again with the confirmed mapping; stored only if it reads cleanly under it.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'logs.attach')
  const { file, fields } = await readFileUpload(event, MAX_LOG_BYTES, '10 MB')
  const { mapping, batchId } = formFieldsValid(fields, logUploadFieldsSchema)
  setResponseStatus(event, 201)
  return await storeLog({ fileName: file.name, bytes: file.bytes, mapping, batchId }, user)
})
