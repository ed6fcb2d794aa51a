/**
 * Which state-changing requests the API accepts, as pure functions of the request's
 * method, path and headers (server/middleware/requestGuard.ts applies them).
 *
 * Cross-site request forgery needs a browser to send a write the user did not mean:
 * an HTML form (form-encoded, multipart or text/plain, which need no CORS pre-flight)
 * or a script on another origin. Refusing every body but application/json closes the
 * first; the Origin check (or, where a browser sends no Origin, Sec-Fetch-Site) closes
 * the second. Another port of the same host is another origin, and only "same-site"
 * to Sec-Fetch-Site, so both refuse it. File uploads are multipart by nature: they keep
 * the Origin check and leave the body's type and size to the upload route.
 */

export const JSON_BODY_LIMIT_BYTES = 1_000_000

const READ_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

export interface WriteRequest {
  method: string
  path: string
  contentType: string | undefined
  contentLength: string | undefined
  transferEncoding: string | undefined
  origin: string | undefined
  secFetchSite: string | undefined
}

export interface Refusal {
  status: number
  message: string
  field: string
  reason: string
}

export function isWrite(method: string): boolean {
  return !READ_METHODS.has(method.toUpperCase())
}

/** next-auth's own endpoints post form-encoded bodies guarded by its CSRF token. */
function isAuthEndpoint(path: string): boolean {
  return path.startsWith('/api/auth/')
}

/** Routes that read a multipart file with their own media-type check and size limit (server/utils/upload.ts). */
const UPLOAD_PATHS = new Set(['/api/logs', '/api/logs/preview'])

function isUpload(request: WriteRequest): boolean {
  return request.method.toUpperCase() === 'POST' && UPLOAD_PATHS.has(request.path.split('?')[0]!)
}

function originRefusal(request: WriteRequest, allowedOrigins: readonly string[]): Refusal | null {
  if (request.origin !== undefined) {
    if (allowedOrigins.includes(request.origin)) return null
    return { status: 403, message: 'Request from another site refused', field: 'Origin', reason: `${request.origin} is not this Slakewise's address` }
  }
  // Browsers that send no Origin still say where a request came from in Sec-Fetch-Site;
  // a client that sends neither is not a browser and cannot carry someone else's cookies.
  const site = request.secFetchSite?.toLowerCase()
  if (site === undefined || site === 'same-origin' || site === 'none') return null
  return { status: 403, message: 'Request from another site refused', field: 'Sec-Fetch-Site', reason: `a ${site} request may not change anything` }
}

function bodyRefusal(request: WriteRequest): Refusal | null {
  if (isUpload(request)) return null
  const length = request.contentLength === undefined ? undefined : Number(request.contentLength)
  const hasBody = (length !== undefined && length > 0) || request.transferEncoding !== undefined || request.contentType !== undefined
  if (!hasBody) return null
  const mediaType = request.contentType?.split(';')[0]?.trim().toLowerCase()
  if (!isAuthEndpoint(request.path) && mediaType !== 'application/json') {
    return { status: 415, message: 'Send JSON', field: 'Content-Type', reason: `must be application/json, not ${mediaType ?? 'missing'}` }
  }
  if (length === undefined || !Number.isFinite(length)) {
    // Without a declared length the size is only known after reading it all.
    return { status: 411, message: 'Length required', field: 'Content-Length', reason: 'send the body with a Content-Length' }
  }
  if (length > JSON_BODY_LIMIT_BYTES) {
    return { status: 413, message: 'Request body too large', field: 'Content-Length', reason: `${length} bytes is over the limit of ${JSON_BODY_LIMIT_BYTES}` }
  }
  return null
}

/** The refusal for an API write, or null when it may go on. Reads always go on. */
export function refuseWrite(request: WriteRequest, allowedOrigins: readonly string[]): Refusal | null {
  if (!isWrite(request.method) || !request.path.startsWith('/api/')) return null
  return originRefusal(request, allowedOrigins) ?? bodyRefusal(request)
}
