import { refuseWrite } from '../security/writeRequests'
import { appOrigins } from '../security/appOrigins'

// Runs before any route reads a body: see server/security/writeRequests.ts for the rules.
export default defineEventHandler((event) => {
  const header = (name: string) => getRequestHeader(event, name)
  const refusal = refuseWrite(
    {
      method: event.method,
      path: event.path,
      contentType: header('content-type'),
      contentLength: header('content-length'),
      transferEncoding: header('transfer-encoding'),
      origin: header('origin'),
      secFetchSite: header('sec-fetch-site'),
    },
    appOrigins(getRequestURL(event).origin, [process.env.AUTH_ORIGIN, useRuntimeConfig().siteOrigin]),
  )
  if (refusal) {
    throw createError({
      statusCode: refusal.status,
      statusMessage: refusal.message,
      data: { problems: [{ field: refusal.field, message: refusal.reason }] },
    })
  }
})
