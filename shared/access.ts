/**
 * The one access table: for each thing people do in Slakewise, the roles that may do it.
 * The server (requireRole), the page guards (definePageMeta capability), the navigation
 * and the controls a page shows all read this table, so they cannot drift apart.
 * An empty list means any signed-in role.
 */
import type { Role } from './roles'

export const ACCESS = {
  /** Anything every signed-in person may do; per-item rules (e.g. batch moves) decide further. */
  'signedIn': [],
  'plans.read': [],
  'plans.edit': ['metallurgist', 'admin'],
  'library.read': [],
  'library.edit': ['metallurgist', 'admin'],
  'schedule.read': [],
  /** Book loads, pick plan revisions for them, and withdraw them. */
  'schedule.book': ['metallurgist', 'admin'],
  /** See the floor's live countdowns; metallurgists watch without recording. */
  'floor.view': ['operator', 'admin', 'metallurgist'],
  /** Record floor moves: charged, at heat, quench started, handed on. */
  'floor.record': ['operator', 'admin'],
  'records.read': ['qa', 'metallurgist', 'admin'],
  'records.signOff': ['qa'],
  /** Correct a floor tap's time at any time before the record is signed (operators only within the shop's correction window). */
  'records.correct': ['metallurgist', 'qa'],
  'records.digest': ['admin'],
  'people.manage': ['admin'],
  'equipment.read': [],
  /** Furnaces, quench stations and shop settings. */
  'equipment.manage': ['admin'],
  'audit.read': ['admin', 'qa'],
  /** See uploaded thermocouple logs and their series. */
  'logs.read': [],
  /** Upload a thermocouple log on its own (probe tests, coupons). */
  'logs.upload': ['metallurgist', 'qa', 'admin'],
  /** Upload a log attached to a load; operators only to a load they are working on (charged and not yet signed). */
  'logs.attach': ['operator', 'metallurgist', 'qa', 'admin'],
  /** Fit a quench medium's coefficient or curve to a log, and save a fit as the medium's curves (a library change with its provenance). */
  'media.calibrate': ['metallurgist', 'admin'],
  'outbox.manage': ['admin'],
  'mail.manage': ['admin'],
} as const satisfies Record<string, readonly Role[]>

export type Capability = keyof typeof ACCESS

/** The roles that have `capability`; empty means any signed-in role. */
export function rolesFor(capability: Capability): readonly Role[] {
  return ACCESS[capability]
}

/** True when a signed-in `role` has `capability`; false when signed out. */
export function can(role: Role | undefined, capability: Capability): boolean {
  if (!role) return false
  const allowed = rolesFor(capability)
  return allowed.length === 0 || allowed.includes(role)
}
