/**
 * When a session token still stands for its account. The token carries the account's
 * session version and the time of sign-in; raising the version in the database ends
 * every session of the account at its next request, and no session outlives one shift
 * however often it is used.
 */
export const SHIFT_SECONDS = 12 * 60 * 60

/** The claims of the session token Slakewise writes (server/api/auth/[...].ts). */
export type SessionToken = Record<string, unknown> & { sv?: unknown; authAt?: unknown }

export interface SessionAccount {
  active: boolean
  sessionVersion: number
  demo: boolean
}

export function sessionStands(account: SessionAccount | undefined, token: SessionToken, nowMs: number, demoAllowed: boolean): boolean {
  if (!account || !account.active) return false
  if (account.demo && !demoAllowed) return false
  if (token.sv !== account.sessionVersion) return false
  const authAt = Number(token.authAt)
  return Number.isFinite(authAt) && nowMs - authAt < SHIFT_SECONDS * 1000 && authAt <= nowMs
}

export interface AccountChange {
  role?: string
  active?: boolean
  password?: string
}

/** An administrator's change that must end the account's open sessions. */
export function changeEndsSessions(before: { role: string; active: boolean }, change: AccountChange): boolean {
  const roleChanged = change.role !== undefined && change.role !== before.role
  const activeChanged = change.active !== undefined && change.active !== before.active
  return change.password !== undefined || roleChanged || activeChanged
}
