import type { Capability } from './access'

export interface NavItem {
  to: string
  label: string
  /** One line for the tool cards on the shift overview. */
  hint: string
  /** What the linked page takes; the same capability as its definePageMeta. */
  capability: Capability
}

// One list drives the header and the tool cards on the shift overview; each entry
// names the capability its page's definePageMeta names (tests/unit/access.test.ts checks).
export const NAV_ITEMS: readonly NavItem[] = [
  { to: '/', label: 'Shift overview', hint: 'What needs you this shift.', capability: 'signedIn' },
  { to: '/plans', label: 'Plans', hint: 'Soak and quench-to-handling times for each load, with revisions.', capability: 'plans.read' },
  { to: '/schedule', label: 'Schedule', hint: 'Furnace and quench-station lanes; book loads into free time.', capability: 'schedule.read' },
  { to: '/floor', label: 'Floor', hint: 'Live countdowns and one-tap floor events.', capability: 'floor.view' },
  { to: '/records', label: 'Records', hint: 'Cooldown records of released loads, signed off by QA.', capability: 'records.read' },
  { to: '/library/materials', label: 'Materials', hint: 'Thermal properties with their sources.', capability: 'library.read' },
  { to: '/logs', label: 'Logs', hint: 'Thermocouple logs from probe tests, coupons and loads.', capability: 'logs.read' },
  { to: '/calibration', label: 'Calibrate', hint: 'Fit a quench medium’s h or h(T) curve to a probe log.', capability: 'media.calibrate' },
  { to: '/library/quenchants', label: 'Quench media', hint: 'Heat-transfer coefficients, their spread and bath temperatures.', capability: 'library.read' },
  { to: '/admin/furnaces', label: 'Furnaces', hint: 'Furnaces, quench stations and shop settings.', capability: 'equipment.manage' },
  { to: '/admin/users', label: 'People', hint: 'Who may sign in, in which role.', capability: 'people.manage' },
  { to: '/admin/audit', label: 'Audit trail', hint: 'Every sign-in and change, newest first.', capability: 'audit.read' },
  { to: '/admin/outbox', label: 'Outbox', hint: 'Every e-mail with its status; retry failures.', capability: 'outbox.manage' },
  { to: '/admin/mail-recipients', label: 'Mail recipients', hint: 'Who receives sheets, rejections and the digest.', capability: 'mail.manage' },
]
