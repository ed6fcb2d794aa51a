/**
 * The demo shop's sign-ins are published in the README, so they work only while the
 * server listens on loopback, where nobody else can reach it.
 */
const LOOPBACK = /^(127\.\d{1,3}\.\d{1,3}\.\d{1,3}|::1|localhost)$/i

export function listensOnLoopbackOnly(host: string | undefined): boolean {
  return host !== undefined && LOOPBACK.test(host.replace(/^\[|\]$/g, ''))
}

/** Nitro listens on every interface when no host is given. */
export function demoSignInsAllowed(env: NodeJS.ProcessEnv = process.env): boolean {
  return listensOnLoopbackOnly(env.NITRO_HOST || env.HOST || undefined)
}
