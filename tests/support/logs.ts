import { BASE_URL } from './stackConfig'
import type { Client } from './http'

/** Posts a log file as multipart/form-data (the browser's way) with optional text fields. */
export async function postLog(client: Client, path: string, file: { name: string; bytes: Uint8Array | string }, fields: Record<string, string> = {}) {
  const form = new FormData()
  form.set('file', new Blob([typeof file.bytes === 'string' ? file.bytes : new Uint8Array(file.bytes)]), file.name)
  for (const [name, value] of Object.entries(fields)) form.set(name, value)
  const response = await fetch(`${BASE_URL}${path}`, { method: 'POST', headers: { cookie: client.cookie, accept: 'application/json' }, body: form })
  const text = await response.text()
  let body: any = text
  try {
    body = JSON.parse(text)
  } catch {
    // not JSON; keep the text
  }
  return { status: response.status, body }
}

export const mappingField = (mapping: unknown) => ({ mapping: JSON.stringify(mapping) })
