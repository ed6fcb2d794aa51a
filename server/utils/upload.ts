import type { H3Event } from 'h3'

/** Room for the multipart boundaries and the text fields sent beside the file. */
const FORM_OVERHEAD_BYTES = 256 * 1024

export interface UploadedFile {
  name: string
  bytes: Uint8Array
}

export interface FileUpload {
  file: UploadedFile
  fields: Record<string, string>
}

function tooLarge(limitLabel: string, size: string): never {
  throw createError({
    statusCode: 413,
    statusMessage: `File over the ${limitLabel} limit`,
    message: `file: ${size} is over the ${limitLabel} limit`,
    data: { problems: [{ field: 'file', message: `${size} is over the ${limitLabel} limit` }] },
  })
}

const megabytes = (bytes: number) => `${(bytes / 1048576).toFixed(1)} MB`

/** The body, refusing it as soon as it grows past `limit` bytes, so an oversized upload is never held whole. */
async function readCapped(event: H3Event, limit: number, limitLabel: string): Promise<Buffer> {
  const declared = Number(getRequestHeader(event, 'content-length'))
  if (Number.isFinite(declared) && declared > limit) tooLarge(limitLabel, megabytes(declared))
  const chunks: Buffer[] = []
  let total = 0
  for await (const chunk of event.node.req) {
    total += (chunk as Buffer).length
    if (total > limit) tooLarge(limitLabel, `more than ${megabytes(limit)}`)
    chunks.push(chunk as Buffer)
  }
  return Buffer.concat(chunks)
}

/**
 * One file (form field `file`) and the text fields of a multipart/form-data body, the
 * file at most `maxFileBytes`. Refusals name the field: 415 for another body type,
 * 413 over the limit (the message says the limit), 400 without a file.
 */
export async function readFileUpload(event: H3Event, maxFileBytes: number, limitLabel: string): Promise<FileUpload> {
  const contentType = getRequestHeader(event, 'content-type') ?? ''
  if (!/^multipart\/form-data\s*;/i.test(contentType)) {
    throw createError({
      statusCode: 415,
      statusMessage: 'Send the file as multipart/form-data',
      data: { problems: [{ field: 'Content-Type', message: 'must be multipart/form-data with the file in the field "file"' }] },
    })
  }
  const body = await readCapped(event, maxFileBytes + FORM_OVERHEAD_BYTES, limitLabel)
  let form: FormData
  try {
    form = await new Request('http://upload.invalid/', { method: 'POST', headers: { 'content-type': contentType }, body: new Uint8Array(body) }).formData()
  } catch {
    throw createError({ statusCode: 400, statusMessage: 'Unreadable form', data: { problems: [{ field: '(body)', message: 'is not readable multipart/form-data' }] } })
  }
  const file = form.get('file')
  if (!(file instanceof File)) {
    throw createError({ statusCode: 400, statusMessage: 'No file', message: 'file: required', data: { problems: [{ field: 'file', message: 'required' }] } })
  }
  if (file.size > maxFileBytes) tooLarge(limitLabel, megabytes(file.size))
  const fields: Record<string, string> = {}
  for (const [name, value] of form.entries()) if (typeof value === 'string') fields[name] = value
  return { file: { name: file.name || 'log.csv', bytes: new Uint8Array(await file.arrayBuffer()) }, fields }
}
