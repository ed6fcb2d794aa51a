// npm run bench:session — the cost of reading who is signed in, without the database:
// next-auth's session handler (what getServerSession ran on every signed-in API request:
// HKDF twice, decrypt, re-encrypt) against server/security/sessionToken.ts (key derived
// once, decrypt only), on the same token, side by side in one run, alternating rounds.
// Both then hand the claims to the same account check, which is left out here (a stand-in
// callback) because it is the same database read either way.
import { performance } from 'node:perf_hooks'
import { AuthHandler } from 'next-auth/core'
import { encode } from 'next-auth/jwt'
import { SHIFT_SECONDS } from '../server/security/sessions'
import { decodeSessionToken, sessionCookieName, sessionTokenFromCookies, sessionTokenKey } from '../server/security/sessionToken'

const ROUNDS = 5
const READS = 4000
const secret = 'slakewise-bench-secret-not-for-production'
const claims = { name: 'Bench Metallurgist', email: 'bench@kestrelbay.example', sub: '2', uid: 2, sv: 0, authAt: Date.now() }
const token = await encode({ token: claims, secret, maxAge: SHIFT_SECONDS })
const cookieName = sessionCookieName(false)
const cookies = { [cookieName]: token, 'next-auth.csrf-token': 'bench' }

const options = {
  secret,
  providers: [],
  trustHost: true,
  basePath: '/api/auth',
  session: { strategy: 'jwt' as const, maxAge: SHIFT_SECONDS },
  callbacks: {
    session: ({ session, token: t }: { session: Record<string, unknown>; token: Record<string, unknown> }) => ({ ...session, user: { id: t.uid } }),
  },
}

/** The request getServerSession hands next-auth (@sidebase/nuxt-auth, authjs provider). */
async function nextAuthSessionRead() {
  const response = await AuthHandler({
    req: { action: 'session', method: 'GET', headers: { cookie: `${cookieName}=${token}` }, body: undefined, cookies, providerId: undefined, error: undefined, host: 'http://127.0.0.1:3000', query: {} },
    options: options as never,
  })
  const uid = (response.body as { user?: { id?: number } }).user?.id
  if (uid !== 2) throw new Error('next-auth did not read the token')
}

const key = await sessionTokenKey(secret)
async function directRead() {
  const read = await decodeSessionToken(sessionTokenFromCookies(cookies, cookieName)!, key, Date.now())
  if (read?.uid !== 2) throw new Error('the reader did not read the token')
}

async function timeReads(read: () => unknown): Promise<number> {
  const start = performance.now()
  for (let i = 0; i < READS; i++) await read()
  return ((performance.now() - start) * 1000) / READS
}

const handler: number[] = []
const direct: number[] = []
await timeReads(nextAuthSessionRead) // warm-up, both
await timeReads(directRead)
for (let round = 0; round < ROUNDS; round++) {
  handler.push(await timeReads(nextAuthSessionRead))
  direct.push(await timeReads(directRead))
}
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!
const a = median(handler)
const b = median(direct)
console.log(`session read, ${READS} reads × ${ROUNDS} rounds, median per read:`)
console.log(`  next-auth session handler (getServerSession's path): ${a.toFixed(1)} µs  (${(1e6 / a).toFixed(0)} reads/s on one core)`)
console.log(`  server/security/sessionToken.ts (cached key, no re-encryption): ${b.toFixed(1)} µs  (${(1e6 / b).toFixed(0)} reads/s)`)
console.log(`  ratio ${(a / b).toFixed(1)}×; the account read from the database follows both and is not timed here`)
