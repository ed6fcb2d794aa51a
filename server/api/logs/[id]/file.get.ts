import { readLogFile } from '../../../measurements/logStore'

// The file exactly as uploaded, for audits and re-checks against its SHA-256.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'logs.read')
  const { id } = await paramsValid(event, idParams('Log'))
  const { fileName, bytes } = await readLogFile(id)
  setResponseHeader(event, 'content-type', 'application/octet-stream')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${fileName.replace(/[^\w.-]/g, '_')}"`)
  return bytes
})
