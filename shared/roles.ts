/** The four kinds of people who sign in to Slakewise. */
export const ROLES = ['admin', 'metallurgist', 'operator', 'qa'] as const
export type Role = (typeof ROLES)[number]

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  metallurgist: 'Metallurgist',
  operator: 'Floor operator',
  qa: 'QA lead',
}

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value)
}

/** True when `role` is one of `allowed`. An empty list means any signed-in role. */
export function roleAllows(role: Role | undefined, allowed: readonly Role[]): boolean {
  if (!role) return false
  return allowed.length === 0 || allowed.includes(role)
}
