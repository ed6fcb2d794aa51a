import { finishSuccessfulSignIn, signInSubjects, startSignInAttempt } from '../security/signInLimits'

const CREDENTIALS_CALLBACK = '/api/auth/callback/credentials'

/** Behind a TLS proxy the client's address is the proxy's; SLAKEWISE_TRUST_PROXY=1 reads X-Forwarded-For. */
const trustProxy = process.env.SLAKEWISE_TRUST_PROXY === '1'

// In front of next-auth's credentials sign-in: 429 + Retry-After when the account or the
// client address is over its limit (server/security/signInLimits.ts), before any hashing.
export default defineEventHandler(async (event) => {
  if (event.method !== 'POST' || event.path.split('?')[0] !== CREDENTIALS_CALLBACK) return
  // h3 keeps the body it read, so next-auth reads the same form after this.
  const form = ((await readBody(event).catch(() => null)) ?? {}) as Record<string, unknown>
  const email = typeof form.email === 'string' ? form.email : ''
  const subjects = signInSubjects(email, getRequestIP(event, { xForwardedFor: trustProxy }) ?? 'unknown')
  const waitS = await startSignInAttempt(useDb(), subjects)
  if (waitS > 0) {
    setResponseHeader(event, 'Retry-After', waitS)
    throw createError({
      statusCode: 429,
      statusMessage: 'Too many sign-in attempts',
      data: { problems: [{ field: 'email', message: `Too many attempts; try again in ${waitS} s` }], retryAfterSeconds: waitS },
    })
  }
  event.node.res.once('finish', () => {
    const cookies = String(event.node.res.getHeader('set-cookie') ?? '')
    if (cookies.includes('next-auth.session-token=')) {
      finishSuccessfulSignIn(useDb(), subjects).catch((error) => console.error('[sign-in] could not clear the attempt count', error))
    }
  })
})
