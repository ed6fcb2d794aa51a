import type { Role } from '../../../shared/roles'

/**
 * Demo data for a fictional shop, Kestrel Bay Heat Treat. Invented for
 * demonstration only; no real company, person or address.
 */
export const DEMO_SHOP_NAME = 'Kestrel Bay Heat Treat'
/** The demo's load numbers start with the shop's initials. */
export const DEMO_LOAD_PREFIX = 'KB'

export interface DemoUser {
  email: string
  displayName: string
  role: Role
  password: string
}

export const DEMO_USERS: DemoUser[] = [
  { email: 'admin@kestrelbay.example', displayName: 'Rowan Achterberg', role: 'admin', password: 'kestrel-admin-1' },
  { email: 'metallurgist@kestrelbay.example', displayName: 'Mira Okonkwo', role: 'metallurgist', password: 'kestrel-metal-1' },
  { email: 'operator@kestrelbay.example', displayName: 'Tomas Vidal', role: 'operator', password: 'kestrel-floor-1' },
  { email: 'qa@kestrelbay.example', displayName: 'June Halvorsen', role: 'qa', password: 'kestrel-qa-01' },
]
