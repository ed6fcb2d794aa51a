import { gzipSync } from 'node:zlib'

/** Below this, gzip's header and the CPU are not worth it. */
const MIN_BYTES = 1024

// Pages and JSON answers are gzipped for browsers that accept it (bundles and fonts are
// pre-compressed at build time, nitro.compressPublicAssets). Streams and binary files
// such as the PDF sheets pass unchanged.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('beforeResponse', (event, response) => {
    const body = response.body
    if (body === null || body === undefined || typeof body === 'number' || typeof body === 'boolean') return
    if (typeof body !== 'string' && (body instanceof Uint8Array || typeof (body as { pipe?: unknown }).pipe === 'function' || body instanceof ReadableStream)) return
    if (!/\bgzip\b/.test(getRequestHeader(event, 'accept-encoding') ?? '') || getResponseHeader(event, 'content-encoding')) return
    const text = typeof body === 'string' ? body : JSON.stringify(body)
    if (Buffer.byteLength(text) < MIN_BYTES) return
    if (typeof body !== 'string' && !getResponseHeader(event, 'content-type')) setResponseHeader(event, 'content-type', 'application/json')
    setResponseHeader(event, 'content-encoding', 'gzip')
    appendResponseHeader(event, 'vary', 'accept-encoding')
    removeResponseHeader(event, 'content-length')
    response.body = gzipSync(text)
  })
})
