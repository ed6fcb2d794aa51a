import { MAX_LOG_BYTES } from '../../measurements/parseLog'
import { previewUpload } from '../../measurements/logStore'

// Step one of an upload: what the file holds, so the person can map its columns. Nothing is stored.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'logs.attach')
  const { file } = await readFileUpload(event, MAX_LOG_BYTES, '10 MB')
  return await previewUpload(file.bytes)
})
