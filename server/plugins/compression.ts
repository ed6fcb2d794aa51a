import { promisify } from 'node:util'
import { gzip } from 'node:zlib'

const gzipAsync = promisify(gzip)
/** Below this a response fits in a packet or two; compressing it costs more than it saves. */
const MIN_BYTES = 1024

/**
 * Gzips API answers and rendered pages for clients that accept it (Nitro compresses
 * only prebuilt static files). Bodies that are streams, buffers (PDFs, already
 * compressed), web Responses or server-sent events pass untouched, as does anything
 * another layer has already encoded. zlib runs on libuv's thread pool, not the
 * request thread.
 */
export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('beforeResponse', async (event, response) => {
    const body = response.body
    if (typeof body !== 'string' && !isPlainJson(body)) return
    if (!/\bgzip\b/.test(getRequestHeader(event, 'accept-encoding') ?? '')) return
    if (getResponseHeader(event, 'content-encoding')) return
    const type = String(getResponseHeader(event, 'content-type') ?? '')
    if (type.includes('text/event-stream')) return
    const text = typeof body === 'string' ? body : JSON.stringify(body)
    if (Buffer.byteLength(text) < MIN_BYTES) return
    if (!type) setResponseHeader(event, 'content-type', typeof body === 'string' ? 'text/html; charset=utf-8' : 'application/json')
    setResponseHeader(event, 'content-encoding', 'gzip')
    appendResponseHeader(event, 'vary', 'accept-encoding')
    response.body = await gzipAsync(text)
  })
})

/** Objects and arrays h3 would send as JSON (not streams, buffers, Responses or errors). */
function isPlainJson(body: unknown): body is object {
  if (body === null || typeof body !== 'object') return false
  if (Array.isArray(body)) return true
  const proto = Object.getPrototypeOf(body)
  return proto === Object.prototype || proto === null
}
