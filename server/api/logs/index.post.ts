import { logUploadFieldsSchema } from '../../../shared/schemas/measurementLog'
import { MAX_LOG_BYTES } from '../../measurements/parseLog'
import { storeLog } from '../../measurements/logStore'
import { reissueCooldownRecord } from '../../records/service'

// Step two: the same file again with the confirmed mapping; stored only if it reads cleanly under it.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'logs.attach')
  const { file, fields } = await readFileUpload(event, MAX_LOG_BYTES, '10 MB')
  const { mapping, batchId, startedAt, quenchAtLog_s } = formFieldsValid(fields, logUploadFieldsSchema)
  const start = startedAt === undefined ? undefined : new Date(startedAt)
  const upload = { fileName: file.name, bytes: file.bytes, mapping, batchId, startedAt: start, quenchAtLog_s }
  const config = useShopConfig()
  setResponseStatus(event, 201)
  // A released load's unsigned record is re-issued with the new trace in the same transaction (a signed one refuses the log).
  return await storeLog(upload, user, async (tx, id) => {
    const record = await reissueCooldownRecord(tx, id, config)
    return record ? { ...record } : null
  })
})
