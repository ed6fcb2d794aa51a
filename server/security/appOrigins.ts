/**
 * The origins this server answers as: the address the request was sent to (its Host
 * header) and the configured addresses (AUTH_ORIGIN, NUXT_SITE_ORIGIN), which behind a
 * TLS proxy carry the https:// address browsers see.
 */
export function appOrigins(requestOrigin: string, configured: readonly (string | undefined)[]): string[] {
  const origins = [requestOrigin]
  for (const value of configured) {
    if (!value) continue
    try {
      origins.push(new URL(value).origin)
    } catch {
      // An unparsable address names no origin; the request's own still applies.
    }
  }
  return origins
}
