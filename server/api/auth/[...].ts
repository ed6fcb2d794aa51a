import CredentialsProvider from 'next-auth/providers/credentials'
import { eq, sql } from 'drizzle-orm'
import { NuxtAuthHandler } from '#auth'
import { signInSchema } from '../../../shared/schemas/user'
import { users } from '../../db/schema'
import { spendPasswordCheckOnUnknownAccount } from '../../security/unknownAccount'
import { demoSignInsAllowed } from '../../security/demoShop'
import { SHIFT_SECONDS } from '../../security/sessions'
import { sessionAccountUser } from '../../security/sessionUser'

// The provider ships as CommonJS; its default export sits one level down under ESM.
const Credentials = ((CredentialsProvider as unknown as { default?: typeof CredentialsProvider }).default ?? CredentialsProvider)

const config = useRuntimeConfig()

async function authorize(credentials: Record<string, string> | undefined) {
  const parsed = signInSchema.safeParse(credentials ?? {})
  if (!parsed.success) return null
  const { email, password } = parsed.data
  // Attempts are counted and limited before this runs (server/middleware/signInLimit.ts).
  const [user] = await useDb().select().from(users).where(eq(users.email, email))
  // The same answer, after the same hashing work, for an unknown e-mail, a wrong password,
  // an inactive account and a demo account off loopback.
  const ok = user ? await verifyPassword(password, user.passwordHash) : await spendPasswordCheckOnUnknownAccount(password)
  if (!user || !ok || !user.active || (user.demo && !demoSignInsAllowed())) return null
  await recordAudit(useDb(), { actorId: user.id, action: 'session.sign-in', entityType: 'user', entityId: user.id })
  return { id: String(user.id), email: user.email, name: user.displayName, role: user.role, sessionVersion: user.sessionVersion }
}

export default NuxtAuthHandler({
  secret: config.authSecret,
  pages: { signIn: '/login' },
  session: { strategy: 'jwt', maxAge: SHIFT_SECONDS },
  // The API reads the same cookie itself (server/utils/auth.ts), by the same name.
  useSecureCookies: secureSessionCookies(),
  providers: [
    Credentials({
      name: 'Slakewise',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      authorize,
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.uid = Number(user.id)
        token.sv = (user as { sessionVersion?: number }).sessionVersion
        token.authAt = Date.now()
      }
      return token
    },
    async session({ session, token }) {
      // Re-read the account: deactivation, a role change, a new password or signing out
      // raise its session version and end this session at its next request.
      const user = await sessionAccountUser(useDb(), token, Date.now(), demoSignInsAllowed())
      return (user ? { ...session, user } : { expires: session.expires }) as typeof session
    },
  },
  events: {
    // Signing out ends the account's sessions everywhere, so a copied cookie stops working too.
    async signOut({ token }) {
      const id = Number(token?.uid)
      if (Number.isInteger(id) && id > 0) await useDb().update(users).set({ sessionVersion: sql`${users.sessionVersion} + 1` }).where(eq(users.id, id))
    },
  },
})
