/**
 * The audit trail in words: what kind of thing each entry is about, what was done, and
 * its details as "field: value" lines, so people never read stored codes or raw JSON.
 * Pure, shared by the audit page and its tests.
 */
import { FURNACE_KIND_LABELS } from './labels'
import { QUENCHANT_KIND_LABELS } from './library'
import { BATCH_STATE_LABELS, type BatchState } from './schedule'

/** Stored kind codes ("still-air", "car-bottom") in the words the pages use. */
const KIND_WORDS: Record<string, string> = { ...FURNACE_KIND_LABELS, ...QUENCHANT_KIND_LABELS }

export const AUDIT_KIND_LABELS: Record<string, string> = {
  batch: 'Load',
  plan: 'Plan',
  cooldown_record: 'Cooldown record',
  user: 'Person',
  material: 'Material',
  quenchant: 'Quench medium',
  furnace: 'Furnace',
  quench_station: 'Quench station',
  shop_settings: 'Shop settings',
  outbox_message: 'E-mail',
  mail_recipients: 'Mail recipients',
  shop: 'Shop',
}

const ACTIONS: Record<string, string> = {
  'session.sign-in': 'Signed in',
  'station.create': 'Added a quench station',
  'station.update': 'Changed a quench station',
  'batch.book': 'Booked a load',
  'batch.move': 'Moved a booking',
  'batch.cancelled': 'Cancelled a booking',
  'plan.create': 'Saved a new plan',
  'plan.revise': 'Saved a plan revision',
  'plan.duplicate': 'Duplicated a plan',
  'plan.archive': 'Archived a plan',
  'plan.restore': 'Brought a plan back from the archive',
  'record.create': 'Wrote a cooldown record',
  'record.approve': 'Approved a cooldown record',
  'record.reject': 'Rejected a cooldown record',
  'record.approve_refused': 'Was refused approving a record',
  'record.reject_refused': 'Was refused rejecting a record',
  'record.digest': 'Queued the daily digest',
  'outbox.retry': 'Retried an e-mail',
  'outbox.test_sheet': 'Sent a test sheet',
  'mail_recipients.update': 'Changed mail recipients',
  'settings.update': 'Changed shop settings',
  'user.create': 'Added a person',
  'user.update': 'Changed a person',
  'demo.seed': 'Seeded the demo shop',
  'quenchant.calibrate': 'Saved a calibration as a quench medium’s curves',
}

const VERBS: Record<string, string> = { create: 'Added', update: 'Changed' }

/** "Recorded Quenching", "Added a furnace": the action code in words. */
export function describeAction(action: string): string {
  if (ACTIONS[action]) return ACTIONS[action]
  const [entity = '', verb = ''] = action.split('.')
  if (entity === 'batch' && verb in BATCH_STATE_LABELS) return `Recorded ${BATCH_STATE_LABELS[verb as BatchState]}`
  const kind = (AUDIT_KIND_LABELS[entity] ?? entity.replace(/[_-]/g, ' ')).toLowerCase()
  return `${VERBS[verb] ?? verb.replace(/[_-]/g, ' ')} ${/^[aeiou]/.test(kind) ? 'an' : 'a'} ${kind}`.replace(/^\w/, (c) => c.toUpperCase())
}

/** "loadNumber" → "load number", "hTypical_W_m2K" → "h typical (W/m2K)"; stored "batch" keys read as "load". */
export function fieldName(key: string): string {
  const [name = key, unit] = key.split(/_(.+)/)
  const words = name.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase().replace(/\bbatch\b/g, 'load')
  return unit ? `${words} (${unit.replace(/_/g, '/')})` : words
}

function valueInWords(value: unknown, key = ''): string {
  if (value === null || value === undefined || value === '') return '—'
  if (key === 'kind' && typeof value === 'string') return KIND_WORDS[value] ?? value
  if (typeof value === 'boolean') return value ? 'yes' : 'no'
  if (Array.isArray(value)) return value.map((item) => valueInWords(item)).join(', ') || '—'
  if (typeof value === 'object') return Object.entries(value).map(([k, v]) => `${fieldName(k)} ${valueInWords(v, k)}`).join(', ')
  return String(value)
}

/** One "field: value" line per detail; nested values read "from furnace id 3, …". */
export function describeDetails(details: Record<string, unknown> | null): string[] {
  if (!details) return []
  return Object.entries(details).map(([key, value]) => `${fieldName(key)}: ${valueInWords(value, key)}`)
}
