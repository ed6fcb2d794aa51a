import CredentialsProvider from 'next-auth/providers/credentials'
import { eq } from 'drizzle-orm'
import { NuxtAuthHandler } from '#auth'
import { signInSchema } from '../../../shared/schemas/user'
import { users } from '../../db/schema'
import { clearSignInFailures, noteSignInFailure, signInDelayMs } from '../../accounts/signInThrottle'

// The provider ships as CommonJS; its default export sits one level down under ESM.
const Credentials = ((CredentialsProvider as unknown as { default?: typeof CredentialsProvider }).default ?? CredentialsProvider)

const config = useRuntimeConfig()

async function authorize(credentials: Record<string, string> | undefined) {
  const parsed = signInSchema.safeParse(credentials ?? {})
  if (!parsed.success) return null
  const { email, password } = parsed.data
  const delay = await signInDelayMs(email)
  if (delay > 0) await new Promise((resolve) => setTimeout(resolve, delay))
  const [user] = await useDb().select().from(users).where(eq(users.email, email))
  // The same answer for an unknown e-mail, a wrong password and an inactive account.
  const ok = user ? await verifyPassword(password, user.passwordHash) : false
  if (!user || !ok || !user.active) {
    await noteSignInFailure(email)
    return null
  }
  await clearSignInFailures(email)
  await recordAudit(useDb(), { actorId: user.id, action: 'session.sign-in', entityType: 'user', entityId: user.id })
  return { id: String(user.id), email: user.email, name: user.displayName, role: user.role }
}

export default NuxtAuthHandler({
  secret: config.authSecret,
  pages: { signIn: '/login' },
  session: { strategy: 'jwt', maxAge: 12 * 60 * 60 },
  providers: [
    Credentials({
      name: 'Slakewise',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      authorize,
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) token.uid = Number(user.id)
      return token
    },
    async session({ session, token }) {
      // Re-read the account so a deactivated user's open session stops at the next request,
      // and a role change shows without signing in again.
      const [row] = await useDb().select().from(users).where(eq(users.id, Number(token.uid)))
      if (!row || !row.active) return { expires: session.expires } as typeof session
      return {
        ...session,
        user: { id: row.id, email: row.email, name: row.displayName, role: row.role },
      } as typeof session
    },
  },
})
