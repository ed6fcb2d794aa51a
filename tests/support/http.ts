import { BASE_URL } from './stackConfig'
import { DEMO_USERS } from '../../server/db/demo/shop'
import type { Role } from '../../shared/roles'

/** A signed-in client: a cookie jar over fetch, signing in through the real auth endpoints. */
export interface Client {
  cookie: string
  request: (path: string, init?: { method?: string; body?: unknown; rawBody?: string }) => Promise<{ status: number; body: any }>
}

function mergeCookies(jar: Map<string, string>, response: Response) {
  for (const line of response.headers.getSetCookie()) {
    const [pair] = line.split(';')
    const index = pair!.indexOf('=')
    jar.set(pair!.slice(0, index), pair!.slice(index + 1))
  }
}

function cookieHeader(jar: Map<string, string>) {
  return [...jar].map(([name, value]) => `${name}=${value}`).join('; ')
}

function makeClient(jar: Map<string, string>, baseUrl = BASE_URL): Client {
  return {
    get cookie() {
      return cookieHeader(jar)
    },
    async request(path, init = {}) {
      const headers: Record<string, string> = { cookie: cookieHeader(jar), accept: 'application/json' }
      let body: string | undefined
      if (init.rawBody !== undefined) {
        headers['content-type'] = 'application/json'
        body = init.rawBody
      } else if (init.body !== undefined) {
        headers['content-type'] = 'application/json'
        body = JSON.stringify(init.body)
      }
      const response = await fetch(`${baseUrl}${path}`, { method: init.method ?? 'GET', headers, body })
      const text = await response.text()
      let parsed: unknown = text
      try {
        parsed = JSON.parse(text)
      } catch {
        // not JSON; keep the text
      }
      return { status: response.status, body: parsed }
    },
  }
}

/** The same session (its cookies, copied) sent to another server instance, as a proxy without sticky sessions would. */
export function sameSessionAt(client: Client, baseUrl: string): Client {
  const jar = new Map(client.cookie.split('; ').filter(Boolean).map((pair) => [pair.slice(0, pair.indexOf('=')), pair.slice(pair.indexOf('=') + 1)] as [string, string]))
  return makeClient(jar, baseUrl)
}

export function anonymous(): Client {
  return makeClient(new Map())
}

/** Where a sign-in comes from: another server, or another client address (the stack trusts X-Forwarded-For). */
export interface SignInVia {
  baseUrl?: string
  address?: string
}

export interface SignInAttempt {
  status: number
  retryAfter: string | null
  client: Client | null
}

/** One sign-in through /api/auth/csrf and /api/auth/callback/credentials, with its HTTP answer. */
export async function attemptSignIn(email: string, password: string, via: SignInVia = {}): Promise<SignInAttempt> {
  const base = via.baseUrl ?? BASE_URL
  const forwarded: Record<string, string> = via.address ? { 'x-forwarded-for': via.address } : {}
  const jar = new Map<string, string>()
  const csrfResponse = await fetch(`${base}/api/auth/csrf`)
  mergeCookies(jar, csrfResponse)
  const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string }
  const form = new URLSearchParams({ csrfToken, email, password, json: 'true', callbackUrl: '/' })
  const response = await fetch(`${base}/api/auth/callback/credentials`, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', 'cookie': cookieHeader(jar), ...forwarded },
    body: form,
    redirect: 'manual',
  })
  mergeCookies(jar, response)
  const signedIn = [...jar.keys()].some((name) => name.endsWith('next-auth.session-token'))
  return { status: response.status, retryAfter: response.headers.get('retry-after'), client: signedIn ? makeClient(jar, base) : null }
}

/** Signs in through the real auth endpoints. Resolves to null on refusal. */
export async function signInAs(email: string, password: string, via: SignInVia = {}): Promise<Client | null> {
  return (await attemptSignIn(email, password, via)).client
}

export function demoUser(role: Role) {
  const user = DEMO_USERS.find((candidate) => candidate.role === role)
  if (!user) throw new Error(`no demo user with role ${role}`)
  return user
}

export async function signInDemo(role: Role): Promise<Client> {
  const user = demoUser(role)
  const client = await signInAs(user.email, user.password)
  if (!client) throw new Error(`demo ${role} could not sign in`)
  return client
}
