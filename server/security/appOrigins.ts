/**
 * The origins this server answers as: the address the request was sent to (its Host
 * header), the sign-in address (AUTH_ORIGIN) and the address in mail links (PUBLIC_ORIGIN).
 * Behind a TLS proxy the last two carry the https:// address browsers see.
 */
export function appOrigins(requestOrigin: string, env: NodeJS.ProcessEnv = process.env): string[] {
  const origins = [requestOrigin]
  for (const value of [env.AUTH_ORIGIN, env.PUBLIC_ORIGIN]) {
    if (!value) continue
    try {
      origins.push(new URL(value).origin)
    } catch {
      // An unparsable address names no origin; the request's own still applies.
    }
  }
  return origins
}
