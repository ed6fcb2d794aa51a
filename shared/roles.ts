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
